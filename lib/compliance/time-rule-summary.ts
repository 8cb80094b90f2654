// Per channel: how each time rule of the revision fared, and the note saying what the rules
// were evaluated on.
import { accumulationNote, causeText, formatDurationS } from "../reports/result-wording";
import { ruleMeasures } from "./evaluate-time-rule";
import type { ChannelContext } from "./evaluation-types";
import type { TimeRule } from "./model";
import type { ComplianceAggregate, ComplianceRow, NotEvaluatedCause, TimeBasis, TimeRuleSummary } from "./result";

/** Per rule: applied or not on this channel, from the chosen band's rows and aggregates. */
export function summarizeTimeRules(rows: ComplianceRow[], aggregates: ComplianceAggregate[], ctx: ChannelContext): TimeRuleSummary[] | undefined {
  if (!ctx.time) return undefined;
  const time = ctx.time;
  const judged = [...rows, ...aggregates];
  const results = judged.flatMap((row) => row.rowRules ?? []);
  return time.rules.map((rule): TimeRuleSummary => {
    const mine = results.filter((result) => result.rule === rule.id);
    const evaluated = mine.filter((result) => result.verdict !== "not-evaluated");
    const applied = evaluated.length > 0;
    // The accumulation of the evaluated result with the most periods (the same record for every order).
    const accumulation = evaluated.map((result) => result.accumulation).find((candidate) => candidate !== undefined);
    const cause: NotEvaluatedCause | undefined = applied
      ? undefined
      : (mine.find((result) => result.verdict === "not-evaluated")?.cause ?? time.unavailable ?? { code: "no-applicable-row" });
    const reason = cause ? causeText(cause) : accumulationNote(accumulation);
    return {
      rule: rule.id,
      label: rule.label,
      multiplier: rule.multiplier,
      status: applied ? "applied" : "not-evaluated",
      ...(reason ? { reason } : {}),
      measures: ruleMeasures(rule),
      ...(cause ? { cause } : {}),
      ...(accumulation ? { accumulation } : {}),
      valueCount: Math.max(0, ...evaluated.map((result) => result.valueCount ?? 0)),
      periodCount: Math.max(0, ...evaluated.map((result) => result.periodCount ?? 0)),
      failures:
        judged.filter((row) => row.decidedBy === rule.id && row.verdict === "fail").length +
        judged.filter((row) => row.decidedBy !== rule.id && row.rowRules?.some((result) => result.rule === rule.id && result.verdict === "fail")).length,
      ...(rule.source ? { source: rule.source } : {}),
    };
  });
}

/** One note saying what the time rules were evaluated on and which were not. */
export function timeRulesNote(rules: TimeRule[], basis: TimeBasis, summary: TimeRuleSummary[] | undefined): string {
  const on =
    basis.source === "none"
      ? "no per-window series"
      : `${basis.valueCount} ${basis.source === "windows" ? "10/12-cycle window" : `${formatDurationS(basis.valueS ?? 0)} interval-log`} value(s) over ${formatDurationS(basis.durationS)}${
          basis.startMs === null ? " (10-minute values counted from the record start: no start time given)" : " (10-minute values aligned to the clock)"
        }`;
  const skipped = (summary ?? []).filter((rule) => rule.status === "not-evaluated");
  const fallback = basis.snapshotFallback
    ? "; where a time rule cannot be evaluated the capture r.m.s. mean is compared with 1.0 × the limit"
    : "";
  return `time rules ${rules.map((rule) => `"${rule.label}"`).join(", ")} evaluated on ${on}${
    skipped.length > 0 ? `; not evaluated: ${skipped.map((rule) => `${rule.label} (${rule.cause ? causeText(rule.cause) : (rule.reason ?? "no data")})`).join("; ")}` : ""
  }${fallback}`;
}
