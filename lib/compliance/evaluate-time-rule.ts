// One time rule applied to one order's (or aggregate's) series.
import { orderStatistic } from "../analysis/order-statistic";
import { approxEqual } from "./approx-equal";
import { deriveRuleValues, formatDurationS, type TimeSeriesTiming } from "./derive-rule-values";
import type { TimeRule } from "./model";
import type { RowRuleResult } from "./result";

/** A rule's result with how much data it used. */
export interface TimeRuleOutcome extends RowRuleResult {
  valueCount: number;
  periodCount: number;
  /** Not-evaluated because of the data, not the limit (the same for every row of a channel). */
  dataReason?: string;
}

const VALUES_NAME: Record<TimeRule["intervalS"], string> = {
  0: "10/12-cycle window values",
  1.5: "1.5 s smoothed values",
  3: "3 s values",
  600: "10 min values",
};

function fmt(x: number): string {
  if (x === 0) return "0";
  const magnitude = Math.abs(x);
  return magnitude >= 1000 || magnitude < 0.001 ? x.toPrecision(4) : String(Number(x.toPrecision(4)));
}

function ordinal(p: number): string {
  const n = Math.round(p);
  if (n !== p) return `${p}th`;
  const tens = n % 100;
  if (tens >= 11 && tens <= 13) return `${n}th`;
  return `${n}${["th", "st", "nd", "rd"][n % 10] ?? "th"}`;
}

/** Human description of a rule's statistic, e.g. "99th percentile of 3 s values per 24 h period". */
export function describeTimeRuleStatistic(rule: TimeRule): string {
  const what =
    rule.statistic === "mean" ? "average" : rule.statistic === "max" ? "maximum" : `${ordinal(rule.percentile ?? 0)} percentile (nearest rank)`;
  const over = rule.accumulationS === undefined ? " over the observation period" : ` per ${formatDurationS(rule.accumulationS)} period (worst period)`;
  return `${what} of ${VALUES_NAME[rule.intervalS]}${over}`;
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
  const rank = Math.max(1, Math.ceil(((rule.percentile as number) / 100) * values.length - 1e-9));
  return orderStatistic(Float64Array.from(values), rank - 1);
}

function judge(measured: number, limit: number, passAtLimit: boolean): "pass" | "fail" {
  if (approxEqual(measured, limit)) return passAtLimit ? "pass" : "fail";
  return measured < limit ? "pass" : "fail";
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
  const statistic = describeTimeRuleStatistic(rule);
  const base = {
    rule: rule.id,
    label: rule.label,
    statistic,
    tableLimit,
    multiplier: rule.multiplier,
    unit,
    ...(rule.source ? { source: rule.source } : {}),
  };
  const notEvaluated = (reason: string, isData: boolean): TimeRuleOutcome => ({
    ...base,
    measured: null,
    limit: tableLimit === null ? null : tableLimit * rule.multiplier,
    percentOfLimit: null,
    verdict: "not-evaluated",
    reason: `not evaluated: ${reason}`,
    valueCount: 0,
    periodCount: 0,
    ...(isData ? { dataReason: reason } : {}),
  });

  const n = timing.startsS.length;
  const durationS = n === 0 ? 0 : timing.startsS[n - 1]! + timing.valueS - timing.startsS[0]!;
  const minimum = rule.minimumDurationS;
  if (n === 0 || durationS < minimum * (1 - 1e-9)) {
    return notEvaluated(`needs at least ${formatDurationS(minimum)} of record; the record has ${formatDurationS(durationS)}`, true);
  }
  const derived = deriveRuleValues(values, rule.intervalS, timing);
  if (!derived.ok) return notEvaluated(derived.reason, true);
  if (derived.values.length === 0) {
    const alignment = timing.clockKnown ? "aligned to the clock" : "from the record start";
    return notEvaluated(`no complete ${VALUES_NAME[rule.intervalS].replace(/ values$/, "")} interval (${alignment}) in ${formatDurationS(durationS)} of record`, true);
  }
  if (tableLimit === null) return notEvaluated("no limit for this row", false);

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

  const notes: string[] = [];
  if (rule.accumulationS !== undefined) {
    if (durationS < rule.accumulationS * (1 - 1e-9)) {
      notes.push(
        `the standard accumulates over ${formatDurationS(rule.accumulationS)}; evaluated over the available ${formatDurationS(durationS)} (${derived.values.length} values)`,
      );
    } else if (periods.length > 1) {
      notes.push(`worst of ${periods.length} consecutive ${formatDurationS(rule.accumulationS)} periods from the record start`);
    }
  }
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
        `relaxation to ${relaxation.multiplier * 100} % applies: excursions above ${rule.multiplier * 100} % last ${formatDurationS(excursionS)} < ${formatDurationS(allowedS)} and the average ${fmt(average)} ${unit} < ${relaxation.averageBelowFraction * 100} % of the limit (${relaxation.source})`,
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
  };
}
