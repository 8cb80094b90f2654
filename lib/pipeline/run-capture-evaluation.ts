// Step 2 of one capture's job: analysis + limit-set revision + context → evaluation. The worker,
// the command line, the re-evaluation route and the demo seed call this — one code path, so their
// answers cannot drift apart.
import type { AnalysisResult } from "@/lib/analysis/types";
import { evaluateCompliance } from "@/lib/compliance/evaluate-compliance";
import type { EvaluationContext } from "@/lib/compliance/model";
import type { ComplianceResult } from "@/lib/compliance/result";
import type { LimitSetRevision } from "./types";

/**
 * Judges an analysis against one limit-set revision.
 *
 * @param recordStartMs start of the record, ms since the epoch, when known: 10-minute values of
 *   the time rules then align to the clock (else to the record start).
 */
export function runCaptureEvaluation(analysis: AnalysisResult, limitSet: LimitSetRevision, context: EvaluationContext, recordStartMs?: number): ComplianceResult {
  return evaluateCompliance({
    analysis,
    limitSet: { key: limitSet.key, name: limitSet.name, revision: { id: limitSet.revisionId, number: limitSet.revisionNumber }, content: limitSet.content },
    context,
    ...(recordStartMs !== undefined ? { recordStartMs } : {}),
  });
}
