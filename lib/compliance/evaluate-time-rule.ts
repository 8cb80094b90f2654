// One time rule applied to one order's (or aggregate's) series.
import { percentile } from "../analysis/percentile";
import { accumulationNote, formatDurationS, notEvaluatedText, statisticText } from "../reports/result-wording";
import { approxEqual } from "./approx-equal";
import { deriveRuleValues, type TimeSeriesTiming } from "./derive-rule-values";
import { formatNumber as fmt } from "./format-number";
import { judge } from "./judge";
import type { TimeRule } from "./model";
import type { NotEvaluatedCause, RowRuleResult, RuleAccumulation, RuleStatistic } from "./result";

/** A rule's result with how much data it used. */
export interface TimeRuleOutcome extends RowRuleResult {
  valueCount: number;
  periodCount: number;
  /** Not-evaluated because of the data, not the limit (the same for every row of a channel). */
  dataCause?: NotEvaluatedCause;
}

/** What a time rule measures, as data. */
export function ruleMeasures(rule: TimeRule): RuleStatistic {
  return {
    kind: rule.statistic,
    ...(rule.statistic === "percentile" ? { percentile: rule.percentile } : {}),
    intervalS: rule.intervalS,
    ...(rule.accumulationS !== undefined ? { accumulationS: rule.accumulationS } : {}),
  };
}

function statisticOf(values: Float64Array, rule: TimeRule): number {
  if (rule.statistic === "mean") {
    let sum = 0;
    for (const v of values) sum += v;
    return sum / values.length;
  }
  if (rule.statistic === "max") {
    let max = -Infinity;
    for (const v of values) if (v > max) max = v;
    return max;
  }
  return percentile(values, rule.percentile as number);
}

/**
 * Apply one time rule of a limit-set revision to a series of values in the row's unit:
 * derive the rule's values (window / 1.5 s smoothed / 3 s / 10 min), take the statistic
 * (mean, max or nearest-rank percentile) over each accumulation period from the record start,
 * and compare the worst period's value with table limit × multiplier.
 *
 * A record shorter than `rule.minimumDurationS`, or without a single value of the kind the rule
 * needs, gives `not-evaluated` with the minimum in the reason; a record shorter than the
 * accumulation period but long enough is evaluated over what it has, with a note. The
 * IEC 61000-3-2 Class A 200 % relaxation is applied when the rule carries an enabled one.
 * Complexity O(n) (O(n) average for percentiles).
 *
 * @example
 * evaluateTimeRule(rule, tddPercentPerWindow, timing, 8, "%IL", true)
 * // { rule: "daily-p99-very-short", measured: 9.1, limit: 16, verdict: "pass", … }
 */
export function evaluateTimeRule(
  rule: TimeRule,
  values: ArrayLike<number>,
  timing: TimeSeriesTiming,
  tableLimit: number | null,
  unit: string,
  passAtLimit: boolean,
): TimeRuleOutcome {
  const measures = ruleMeasures(rule);
  const base = {
    rule: rule.id,
    label: rule.label,
    statistic: statisticText(measures),
    measures,
    tableLimit,
    multiplier: rule.multiplier,
    unit,
    ...(rule.source ? { source: rule.source } : {}),
  };
  const notEvaluated = (cause: NotEvaluatedCause, isData: boolean): TimeRuleOutcome => ({
    ...base,
    measured: null,
    limit: tableLimit === null ? null : tableLimit * rule.multiplier,
    percentOfLimit: null,
    verdict: "not-evaluated",
    reason: notEvaluatedText(cause),
    cause,
    valueCount: 0,
    periodCount: 0,
    ...(isData ? { dataCause: cause } : {}),
  });

  const n = timing.startsS.length;
  const durationS = n === 0 ? 0 : timing.startsS[n - 1]! + timing.valueS - timing.startsS[0]!;
  const minimum = rule.minimumDurationS;
  if (n === 0 || durationS < minimum * (1 - 1e-9)) {
    return notEvaluated({ code: "record-too-short", minimumS: minimum, durationS }, true);
  }
  const derived = deriveRuleValues(values, rule.intervalS, timing);
  if (!derived.ok) return notEvaluated(derived.cause, true);
  if (derived.values.length === 0) {
    return notEvaluated({ code: "no-complete-interval", intervalS: rule.intervalS, durationS, clockAligned: timing.clockKnown }, true);
  }
  if (tableLimit === null) return notEvaluated({ code: "no-limit" }, false);
  if (!Number.isFinite(tableLimit)) return notEvaluated({ code: "non-finite", quantity: "limit" }, false);

  // Accumulation periods: consecutive spans of accumulationS from the first value.
  const periods: Array<{ from: number; to: number }> = [];
  if (rule.accumulationS === undefined) periods.push({ from: 0, to: derived.values.length });
  else {
    const origin = derived.startsS[0]!;
    let from = 0;
    while (from < derived.values.length) {
      const index = Math.floor((derived.startsS[from]! - origin) / rule.accumulationS + 1e-9);
      let to = from + 1;
      while (to < derived.values.length && Math.floor((derived.startsS[to]! - origin) / rule.accumulationS + 1e-9) === index) to++;
      periods.push({ from, to });
      from = to;
    }
  }
  let measured = -Infinity;
  for (const period of periods) measured = Math.max(measured, statisticOf(derived.values.subarray(period.from, period.to), rule));
  // Math.max(…, NaN) is NaN and an overflowed value is Infinity: neither may pass or fail a rule.
  if (!Number.isFinite(measured)) return notEvaluated({ code: "non-finite", quantity: "measured" }, false);

  const accumulation: RuleAccumulation | undefined =
    rule.accumulationS === undefined
      ? undefined
      : { periodS: rule.accumulationS, periodCount: periods.length, availableS: durationS, valueCount: derived.values.length };
  const notes: string[] = [];
  const periodNote = accumulationNote(accumulation);
  if (periodNote) notes.push(periodNote);
  const limit = tableLimit * rule.multiplier;
  const rulePassAtLimit = rule.passAtLimit ?? passAtLimit;
  let verdict = judge(measured, limit, rulePassAtLimit);
  let appliedLimit = limit;

  const relaxation = rule.relaxation;
  if (verdict === "fail" && relaxation?.enabled) {
    // IEC 61000-3-2 Class A: up to 200 % if excursions are short and the average is low (from memory).
    const relaxedLimit = tableLimit * relaxation.multiplier;
    let above = 0;
    let sum = 0;
    for (const v of derived.values) {
      if (v > limit) above += 1;
      sum += v;
    }
    const excursionS = above * derived.valueS;
    const allowedS = Math.min(relaxation.maxExcursionFraction * durationS, relaxation.maxExcursionS);
    const average = sum / derived.values.length;
    const failures: string[] = [];
    if (judge(measured, relaxedLimit, true) === "fail") failures.push(`maximum ${fmt(measured)} ${unit} > ${relaxation.multiplier * 100} % of the limit`);
    if (!(excursionS < allowedS)) failures.push(`excursions above ${rule.multiplier * 100} % last ${formatDurationS(excursionS)} ≥ ${formatDurationS(allowedS)}`);
    if (!(average < relaxation.averageBelowFraction * tableLimit)) failures.push(`average ${fmt(average)} ${unit} ≥ ${relaxation.averageBelowFraction * 100} % of the limit`);
    if (failures.length === 0) {
      verdict = "pass";
      appliedLimit = relaxedLimit;
      notes.push(
        `relaxation to ${relaxation.multiplier * 100} % applies: excursions above ${rule.multiplier * 100} % last ${formatDurationS(excursionS)} < ${formatDurationS(allowedS)} and the average ${fmt(average)} ${unit} < ${relaxation.averageBelowFraction * 100} % of the limit`,
      );
    } else notes.push(`relaxation to ${relaxation.multiplier * 100} % does not apply: ${failures.join("; ")}`);
  }
  const atLimit = approxEqual(measured, appliedLimit) ? (rulePassAtLimit ? "exactly at the limit: passes" : "exactly at the limit: fails (the rule asks for less than the limit)") : undefined;
  const reason = [atLimit, ...notes].filter(Boolean).join("; ");
  return {
    ...base,
    measured,
    limit: appliedLimit,
    percentOfLimit: appliedLimit > 0 ? (measured / appliedLimit) * 100 : null,
    verdict,
    ...(reason ? { reason } : {}),
    valueCount: derived.values.length,
    periodCount: periods.length,
    ...(accumulation ? { accumulation } : {}),
  };
}
