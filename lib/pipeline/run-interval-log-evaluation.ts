// An interval log's job, as pure functions: an imported log + a limit-set revision + context →
// the percentile rules judged over the whole period, with trend data thinned for the charts.
import type { AnalysisResult } from "@/lib/analysis/types";
import type { EvaluationContext } from "@/lib/compliance/model";
import type { ComplianceResult } from "@/lib/compliance/result";
import { evaluateIntervalLog, type IntervalLogEvaluation, type IntervalTrend } from "@/lib/intervals/evaluate-interval-log";
import { intervalStatistics } from "@/lib/intervals/interval-statistics";
import type { IntervalLog } from "@/lib/intervals/types";
import { formatDurationS, formatUtc } from "@/lib/reports/result-wording";
import type { LimitSetRevision } from "./types";

/**
 * Judges an imported interval log (importIntervalLogFile / importIntervalLog). Returns the
 * evaluation, the trends for the charts (at most ~2,000 points per series) and a summary in the
 * analysis shape (no channels, no waveform; `intervalLog` holds each channel's logged statistics for the headline numbers), so an interval log is stored and listed like any
 * capture. The worker's first evaluation and every "evaluate again" call this.
 *
 * @example
 * const { result } = runIntervalLogEvaluation(await importIntervalLogFile(path, mapping), revision, context, 50);
 */
export function runIntervalLogEvaluation(
  log: IntervalLog,
  limitSet: LimitSetRevision,
  context: EvaluationContext,
  nominalHz: 50 | 60,
): { analysis: AnalysisResult; trends: IntervalTrend[]; result: ComplianceResult; startMs: number } {
  const evaluation: IntervalLogEvaluation = evaluateIntervalLog(
    log,
    { key: limitSet.key, name: limitSet.name, revision: { id: limitSet.revisionId, number: limitSet.revisionNumber }, content: limitSet.content },
    context,
  );
  const { trends, log: summary, ...result } = evaluation;
  const gapWarnings = summary.gaps.map(
    (g) => `gap after line ${g.afterLine}: ${g.missingIntervals} interval${g.missingIntervals === 1 ? "" : "s"} missing (${formatUtc(g.fromMs)} to ${formatUtc(g.toMs)})`,
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
    intervalLog: intervalStatistics(log),
  };
  return {
    analysis,
    trends,
    startMs: summary.startMs,
    result: { ...result, notes: [...result.notes, `Interval log: ${rows} rows of ${formatDurationS(summary.intervalS)} from ${formatUtc(summary.startMs)} to ${formatUtc(summary.endMs)}.`] },
  };
}
