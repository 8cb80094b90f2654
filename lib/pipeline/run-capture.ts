// The whole job of one capture, as pure functions: CSV file + mapping → analysis; analysis +
// limit-set revision + context → evaluation. The worker, the command line, the re-evaluation
// route and the demo seed call these — one code path, so their answers cannot drift apart.
import { analyzeCsvFile } from "@/lib/analysis/analyze-csv";
import type { AnalysisOptions, AnalysisResult } from "@/lib/analysis/types";
import { evaluateCompliance } from "@/lib/compliance/evaluate-compliance";
import type { EvaluationContext, LimitSetRevisionContent } from "@/lib/compliance/model";
import type { ComplianceResult } from "@/lib/compliance/result";
import type { CaptureMapping } from "@/lib/validations/capture";
import { checkMappingColumns } from "./check-mapping-columns";

export interface Waveform {
  timeS: number[];
  channels: { name: string; unit: string; values: number[] }[];
}

/** One limit set at one revision, as the database (or the seed files) give it. */
export interface LimitSetRevision {
  key: string;
  name: string;
  revisionId: string;
  revisionNumber: number;
  content: LimitSetRevisionContent;
}

/** Translates the mapping form's choices into engine options (per-window order series always on: the time rules need them). */
export function analysisOptionsFrom(mapping: CaptureMapping, context: EvaluationContext): AnalysisOptions {
  const channels: NonNullable<AnalysisOptions["channels"]> = {};
  for (const [name, m] of Object.entries(mapping.channels)) {
    if (m.ignore) {
      channels[name] = { ignore: true };
      continue;
    }
    channels[name] = {
      ...(m.quantity ? { quantity: m.quantity } : {}),
      ...(m.scale !== undefined ? { scale: m.scale } : {}),
      ...(m.phase !== undefined ? { phase: m.phase } : {}),
      ...(m.time ? { time: true } : {}),
    };
  }
  return {
    channels,
    ...(mapping.sampleIntervalS !== undefined ? { sampleIntervalS: mapping.sampleIntervalS } : {}),
    ...(mapping.frequencyHz !== undefined ? { frequencyHz: mapping.frequencyHz } : {}),
    thdMaxOrder: mapping.thdMaxOrder ?? 50,
    ...(context.ilA !== undefined ? { ilA: context.ilA } : {}),
    ...(context.irefA !== undefined ? { irefA: context.irefA } : {}),
    includeOrderSeries: true,
  };
}

/**
 * Analyses a capture file on disk as a stream (memory does not grow with the record's length)
 * and keeps the first few cycles of each channel for the waveform chart.
 *
 * @throws AnalysisInputError for every problem with the file or the mapping (including a mapped
 *   column the file does not have).
 */
export async function analyzeCaptureFile(
  path: string,
  mapping: CaptureMapping,
  context: EvaluationContext,
  { cycles = 3 }: { cycles?: number } = {},
): Promise<{ analysis: AnalysisResult; waveform: Waveform | null }> {
  await checkMappingColumns(path, mapping);
  const { waveform = null, ...analysis } = await analyzeCsvFile(path, { ...analysisOptionsFrom(mapping, context), ...(cycles > 0 ? { keepWaveformCycles: cycles } : {}) });
  return { analysis, waveform };
}

/**
 * Judges an analysis against one limit-set revision.
 *
 * @param recordStartMs start of the record, ms since the epoch, when known: 10-minute values of
 *   the time rules then align to the clock (else to the record start).
 */
export function evaluateCapture(analysis: AnalysisResult, limitSet: LimitSetRevision, context: EvaluationContext, recordStartMs?: number): ComplianceResult {
  return evaluateCompliance({
    analysis,
    limitSet: { key: limitSet.key, name: limitSet.name, revision: { id: limitSet.revisionId, number: limitSet.revisionNumber }, content: limitSet.content },
    context,
    ...(recordStartMs !== undefined ? { recordStartMs } : {}),
  });
}
