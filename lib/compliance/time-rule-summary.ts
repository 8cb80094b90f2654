// Per channel: how each time rule of the revision fared, and the note saying what the rules
// were evaluated on.
import { formatDurationS } from "./derive-rule-values";
import type { ChannelContext } from "./evaluation-types";
import type { TimeRule } from "./model";
import type { ComplianceAggregate, ComplianceRow, TimeBasis, TimeRuleSummary } from "./result";

/** Per rule: applied or not on this channel, from the chosen band's rows and aggregates. */
export function summarizeTimeRules(rows: ComplianceRow[], aggregates: ComplianceAggregate[], ctx: ChannelContext): TimeRuleSummary[] | undefined {
  if (!ctx.time) return undefined;
  const results = [...rows, ...aggregates].flatMap((row) => row.rowRules ?? []);
  return ctx.time.rules.map((rule): TimeRuleSummary => {
    const mine = results.filter((result) => result.rule === rule.id);
    const evaluated = mine.filter((result) => result.verdict !== "not-evaluated");
    const notes = evaluated.map((result) => result.reason).find((reason) => reason?.includes("accumulates") || reason?.includes("periods from"));
    const firstReason = mine.find((result) => result.verdict === "not-evaluated")?.reason?.replace(/^not evaluated: /, "");
    const reason = evaluated.length > 0 ? notes?.split("; ").find((part) => part.includes("accumulates") || part.includes("periods from")) : firstReason ?? ctx.time?.unavailable ?? "no rows or aggregates it applies to";
    return {
      rule: rule.id,
      label: rule.label,
      multiplier: rule.multiplier,
      status: evaluated.length > 0 ? "applied" : "not-evaluated",
      ...(reason ? { reason } : {}),
      valueCount: Math.max(0, ...evaluated.map((result) => result.valueCount ?? 0)),
      periodCount: Math.max(0, ...evaluated.map((result) => result.periodCount ?? 0)),
      failures: [...rows, ...aggregates].filter((row) => row.decidedBy === rule.id && row.verdict === "fail").length +
        [...rows, ...aggregates].filter((row) => row.decidedBy !== rule.id && row.rowRules?.some((result) => result.rule === rule.id && result.verdict === "fail")).length,
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
  return `time rules ${rules.map((rule) => rule.id).join(", ")} evaluated on ${on}${
    skipped.length > 0 ? `; not evaluated: ${skipped.map((rule) => `${rule.rule} (${rule.reason ?? "no data"})`).join("; ")}` : ""
  }${fallback}`;
}
