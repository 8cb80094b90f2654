// Tests judge invented analyses against the seed tables through the product's own pipeline
// functions (the ones the worker and the command line call).
import type { AnalysisResult } from "@/lib/analysis/types";
import { EvaluationContextSchema, type EvaluationContext } from "@/lib/compliance/model";
import type { ComplianceResult } from "@/lib/compliance/result";
import { runCaptureEvaluation } from "@/lib/pipeline/run-capture-evaluation";
import { seedLimitSetRevision } from "@/lib/pipeline/seed-limit-set-revision";

/** Evaluates `analysis` against the seed revision of limit set `key` (throws for an unknown key, naming the known ones). */
export function judgeWithSeed(analysis: AnalysisResult, key: string, context: EvaluationContext = {}): ComplianceResult {
  return runCaptureEvaluation(analysis, seedLimitSetRevision(key), EvaluationContextSchema.parse(context));
}
