// The worker's judge of a stored interval log, for `npm run bench` (kept apart so the bench case
// measures exactly what the worker runs after copying the original to a temporary file).
import { readFileSync } from "node:fs";
import { importIntervalLogFile } from "../lib/intervals/import-interval-log-file";
import { inspectIntervalLog } from "../lib/intervals/inspect-interval-log";
import { runIntervalLogEvaluation } from "../lib/pipeline/run-interval-log-evaluation";
import { seedLimitSetRevision } from "../lib/pipeline/seed-limit-set-revision";

/** Judges the log at `path` as the worker does; returns its size, verdict and stored trend length. */
export async function judgeBenchIntervalLog(path: string): Promise<{ rows: number; verdict: string; trendPoints: number }> {
  const head = readFileSync(path).subarray(0, 128 * 1024).toString("utf8");
  const mapping = inspectIntervalLog(head.slice(0, head.lastIndexOf("\n") + 1)).suggestion.mapping!;
  const log = await importIntervalLogFile(path, mapping);
  const { analysis, result, trends } = runIntervalLogEvaluation(log, seedLimitSetRevision("ieee-519-2014-current"), { iscA: 10_000, ilA: 100, busVoltageV: 480 }, 50);
  return { rows: analysis.window.count, verdict: result.verdict, trendPoints: trends[0]?.timestampsMs.length ?? 0 };
}
