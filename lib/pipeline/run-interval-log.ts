// An interval log's job, as pure functions: CSV text + the user's column mapping + a limit-set
// revision + context → the percentile rules judged over the whole period, with trend data.
import type { AnalysisResult } from "@/lib/analysis/types";
import type { EvaluationContext, LimitSetRevisionContent } from "@/lib/compliance/model";
import { evaluateIntervalLog, type IntervalLogEvaluation, type IntervalTrend } from "@/lib/intervals/evaluate-interval-log";
import { importIntervalLog } from "@/lib/intervals/import-interval-log";
import type { IntervalMappingInput } from "@/lib/intervals/types";
import type { ComplianceResult } from "@/lib/compliance/result";

/**
 * Imports and judges an interval log. Returns the evaluation, the trends for the charts and a
 * summary in the analysis shape (channels are per-interval averages, no waveform), so an
 * interval log is stored and listed like any capture.
 *
 * @throws IntervalLogError naming the line and column of each problem in the file or mapping.
 */
export function judgeIntervalLog(
  text: string,
  mapping: IntervalMappingInput,
  limitSet: { key: string; name: string; revisionId: string; revisionNumber: number; content: LimitSetRevisionContent },
  context: EvaluationContext,
  nominalHz: 50 | 60,
): { analysis: AnalysisResult; trends: IntervalTrend[]; result: ComplianceResult; startMs: number } {
  const log = importIntervalLog(text, mapping);
  const evaluation: IntervalLogEvaluation = evaluateIntervalLog(
    log,
    { key: limitSet.key, name: limitSet.name, revision: { id: limitSet.revisionId, number: limitSet.revisionNumber }, content: limitSet.content },
    context,
  );
  const { trends, log: summary, ...result } = evaluation;
  const gapWarnings = summary.gaps.map(
    (g) => `gap after line ${g.afterLine}: ${g.missingIntervals} interval(s) missing (${new Date(g.fromMs).toISOString()} to ${new Date(g.toMs).toISOString()})`,
  );
  const rows = log.timestampsMs.length;
  const analysis: AnalysisResult = {
    fundamentalHz: nominalHz,
    nominalHz,
    sampleIntervalS: summary.intervalS,
    durationS: rows * summary.intervalS,
    window: { cycles: 0, points: 0, count: rows },
    maxResolvableOrder: 50,
    channels: [],
    power: { phases: [], total: null },
    warnings: [...summary.warnings, ...gapWarnings],
  };
  return { analysis, trends, startMs: summary.startMs, result: { ...result, notes: [...result.notes, `Interval log: ${rows} rows of ${summary.intervalS} s from ${new Date(summary.startMs).toISOString()} to ${new Date(summary.endMs).toISOString()}.`] } };
}
