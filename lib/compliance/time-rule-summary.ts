// Per channel: how each time rule of the revision fared, and the note saying what the rules
// were evaluated on.
import { accumulationNote, causeText, timeRulesNotes } from "../reports/result-wording";
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

/** The notes saying what the time rules were evaluated on, which were not applied and why, and what stood in. */
export function timeRulesNote(rules: TimeRule[], basis: TimeBasis, summary: TimeRuleSummary[] | undefined): string[] {
  // Whether 10-minute values align to the clock matters only to a rule over 10-minute values.
  const clockMatters = rules.some((rule) => rule.intervalS === 600);
  return timeRulesNotes(rules.map((rule) => rule.label), basis, summary, clockMatters);
}
