// The one place where an evaluation's typed fields become words: not-evaluated causes, what a
// time rule measures, its short name, accumulation notes and the threshold sentence (the band
// choice's words are beside it in band-wording.ts). The
// evaluator (for its `reason` texts and the CLI), the sheet, the share page, the PDF and the
// CSV all call these; nothing parses the words back. Relative imports: the evaluator and the
// CLI import this file too.
import { formatNumber } from "../compliance/format-number";
import {
  CAPTURE_MEAN_RULE,
  type ConditionResult,
  type ContextInput,
  type NotEvaluatedCause,
  type PowerChoice,
  type RowRuleResult,
  type RuleAccumulation,
  type RuleStatistic,
  type ThresholdApplied,
  type TimeBasis,
  type TimeRuleSummary,
} from "../compliance/result";

type IntervalS = NonNullable<RuleStatistic["intervalS"]>;

/**
 * A duration for people, the one duration wording of the sheet, the PDF, the CSV and the importers'
 * messages: from an hour up to the nearest minute ("1 h 31 min"), from a minute up to the nearest
 * second ("2 min 5 s"), below that three significant figures ("2.04 s"); whole days as hours
 * ("24 h", "48 h") except a week ("7 days"). O(1).
 *
 * @example formatDurationS(600) // "10 min"
 */
export function formatDurationS(seconds: number): string {
  if (seconds >= 86_400 && Number.isInteger(seconds / 86_400)) return seconds / 86_400 === 7 ? "7 days" : `${seconds / 3600} h`;
  if (seconds >= 3600) {
    // Rounded first, so 7199 s reads "2 h", never "1 h 60 min".
    const minutes = Math.round(seconds / 60);
    const h = Math.floor(minutes / 60);
    const min = minutes - h * 60;
    return min === 0 ? `${h} h` : `${h} h ${min} min`;
  }
  if (seconds >= 60) {
    const whole = Math.round(seconds);
    const min = Math.floor(whole / 60);
    const s = whole - min * 60;
    return s === 0 ? `${min} min` : `${min} min ${s} s`;
  }
  return `${Number(seconds.toPrecision(3))} s`;
}

/** What the user must give for each context input, in a reader's words (never the field name). */
export const INPUT_NEEDS: Record<ContextInput, string> = {
  h: "the harmonic order",
  ratedPowerW: "the rated power P (W)",
  lambda: "the circuit power factor λ",
  ilA: "IL (maximum demand load current at the PCC)",
  irefA: "Iref (reference current)",
  nominalVoltageV: "the nominal voltage of the measured channel",
  fundamental: "a non-zero measured fundamental",
  "ampere-order-limits": "ampere limits for every order",
};

const VALUES_NAME: Record<IntervalS, string> = {
  0: "10/12-cycle window values",
  1.5: "1.5 s smoothed values",
  3: "3 s values",
  600: "10 min values",
};

const INTERVAL_SHORT: Record<IntervalS, string> = { 0: "window", 1.5: "1.5 s smoothed", 3: "3 s", 600: "10 min" };
const INTERVAL_ONE: Record<IntervalS, string> = { 0: "10/12-cycle window", 1.5: "1.5 s smoothed", 3: "3 s", 600: "10 min" };

function recordWords(record: "analysis" | "interval-log"): string {
  return record === "interval-log" ? "the interval log" : "the analysis";
}

/**
 * A not-evaluated cause in words (without a "not evaluated:" prefix).
 *
 * @example causeText({ code: "record-too-short", minimumS: 600, durationS: 120 }) // "needs at least 10 min of record; the record has 2 min"
 */
export function causeText(cause: NotEvaluatedCause): string {
  switch (cause.code) {
    case "missing-input":
      return `${INPUT_NEEDS[cause.input]} not given`;
    case "above-nyquist":
      return `above Nyquist (highest resolvable order ${cause.maxResolvableOrder})`;
    case "not-analysed":
      return `not in the analysis (orders analysed up to ${cause.analysedUpTo})`;
    case "not-in-record":
      return `not in ${recordWords(cause.record)}`;
    case "partial-sum":
      return partialSumText(cause.unavailableOrders, cause.record, false);
    case "no-band":
      return cause.detail;
    case "no-order-series":
      return "the analysis has no per-window order series (analyse the capture again to apply the time rules); the capture r.m.s. mean is compared instead";
    case "no-logged-rows":
      return "the interval log has no rows";
    case "record-too-short":
      return `needs at least ${formatDurationS(cause.minimumS)} of record; the record has ${formatDurationS(cause.durationS)}`;
    case "no-complete-interval":
      return `no complete ${INTERVAL_ONE[cause.intervalS]} interval (${cause.clockAligned ? "aligned to the clock" : "from the record start"}) in ${formatDurationS(cause.durationS)} of record`;
    case "needs-other-values": {
      const logged = `the interval log holds ${formatDurationS(cause.loggedValueS)} values`;
      if (cause.intervalS === 0 || cause.intervalS === 1.5) return `needs 10/12-cycle window values${cause.intervalS === 1.5 ? " (for the 1.5 s smoothing)" : ""}; ${logged}`;
      if (cause.intervalS === 3) return `needs 3 s (150/180-cycle) values; ${logged}`;
      return `needs 10-minute values (or shorter values that divide 10 min); ${logged}`;
    }
    case "no-limit":
      return "no limit for this row";
    case "no-applicable-row":
      return "no rows or aggregates it applies to";
    case "allowance-unchecked":
      return `the ${cause.aggregate} allowance could not be checked`;
    case "non-finite":
      return cause.quantity === "measured" ? "the measured value is not a finite number (overflow or a bad input value)" : "the limit is not a finite number (check the limit formula)";
  }
}

/** An aggregate summed without some orders: the partial value either already fails or cannot show compliance. */
export function partialSumText(unavailableOrders: number[], record: "analysis" | "interval-log", alreadyFails: boolean): string {
  const gap = `orders ${describeOrders(unavailableOrders)} unavailable (above Nyquist or ${record === "analysis" ? "not analysed" : `not in ${recordWords(record)}`})`;
  return `${gap}; the partial value ${alreadyFails ? "already exceeds the limit" : "cannot show compliance"}`;
}

/**
 * How an interval log's THD or TDD values were formed when the log does not hold every order of the
 * aggregate: from its THD column, which covers the logger's own order range.
 *
 * @example loggedThdText([6, 8, 10, 12]) // "distortion per interval from the logged THD × the fundamental, over the logger's own order range (orders 6–12 (4 orders) are not logged one by one)"
 */
export function loggedThdText(unloggedOrders: number[]): string {
  return `distortion per interval from the logged THD × the fundamental, over the logger's own order range (orders ${describeOrders(unloggedOrders)} are not logged one by one)`;
}

/** "not evaluated: " + the cause. */
export function notEvaluatedText(cause: NotEvaluatedCause): string {
  return `not evaluated: ${causeText(cause)}`;
}

/** "3, 5, 7" or "21–39 (10 orders)". */
export function describeOrders(orders: number[]): string {
  if (orders.length <= 3) return orders.join(", ");
  return `${orders[0]}–${orders[orders.length - 1]} (${orders.length} orders)`;
}

function ordinal(p: number): string {
  const n = Math.round(p);
  if (n !== p) return `${p}th`;
  const tens = n % 100;
  if (tens >= 11 && tens <= 13) return `${n}th`;
  return `${n}${["th", "st", "nd", "rd"][n % 10] ?? "th"}`;
}

/**
 * What a rule measures, e.g. "99th percentile (nearest rank) of 3 s values per 24 h period (worst period)".
 *
 * @example statisticText({ kind: "max", intervalS: 1.5 }) // "maximum of 1.5 s smoothed values over the observation period"
 */
export function statisticText(measures: RuleStatistic): string {
  if (measures.kind === "capture-mean") return `r.m.s. mean over the capture's ${measures.windowCount ?? 0} window(s)`;
  const what = measures.kind === "mean" ? "average" : measures.kind === "max" ? "maximum" : `${ordinal(measures.percentile ?? 0)} percentile (nearest rank)`;
  // "per 7-day period", "per 24 h period".
  const period = measures.accumulationS === 7 * 86_400 ? "7-day" : measures.accumulationS === undefined ? "" : formatDurationS(measures.accumulationS);
  const over = measures.accumulationS === undefined ? " over the observation period" : ` per ${period} period (worst period)`;
  return `${what} of ${VALUES_NAME[measures.intervalS ?? 0]}${over}`;
}

/** A rule result's statistic in words: from its typed fields, else the text stored with it. */
export function ruleStatisticText(result: Pick<RowRuleResult, "measures" | "statistic">): string {
  return result.measures ? statisticText(result.measures) : (result.statistic ?? "");
}

/** "window", "1.5 s smoothed", "3 s", "10 min"; null for the capture mean. */
export function intervalText(measures: RuleStatistic): string | null {
  return measures.intervalS === undefined ? null : INTERVAL_SHORT[measures.intervalS];
}

/** "24 h" or "whole record". */
export function accumulationText(measures: RuleStatistic): string {
  return measures.accumulationS === undefined ? "whole record" : formatDurationS(measures.accumulationS);
}

/** "×1.5" — the multiplier as printed next to a limit. */
export function formatMultiplier(multiplier: number): string {
  return `×${Number(multiplier.toPrecision(4))}`;
}

/**
 * A short name of a rule for the "decided by" column: "mean 1.5 s smoothed",
 * "max 1.5 s smoothed ×1.5", "p99 3 s / 24 h ×2", "capture mean", "threshold". Results stored
 * before rules carried `measures` show the rule's label; the rule's id is never shown.
 */
export function shortRuleLabel(rule: Pick<RowRuleResult, "rule" | "measures" | "multiplier" | "label"> | undefined, id?: string): string {
  const ruleId = rule?.rule ?? id;
  if (ruleId === CAPTURE_MEAN_RULE || rule?.measures?.kind === "capture-mean") return "capture mean";
  if (ruleId === "threshold") return "threshold";
  // A rule's id is internal: without its result (or label) the column says "time rule", never the id.
  if (!rule) return ruleId === undefined ? "—" : "time rule";
  const m = rule.measures;
  if (!m) return rule.label || "time rule";
  const what = m.kind === "mean" ? "mean" : m.kind === "max" ? "max" : `p${m.percentile ?? ""}`;
  const period = m.accumulationS === undefined ? "" : ` / ${formatDurationS(m.accumulationS)}`;
  const times = rule.multiplier === 1 ? "" : ` ${formatMultiplier(rule.multiplier)}`;
  return `${what} ${intervalText(m) ?? ""}${period}${times}`;
}

/** How a rule's accumulation periods covered the record, or undefined when there is nothing to say. */
export function accumulationNote(accumulation: RuleAccumulation | undefined): string | undefined {
  if (!accumulation) return undefined;
  const { periodS, availableS, periodCount, valueCount } = accumulation;
  if (availableS < periodS * (1 - 1e-9)) {
    return `the standard accumulates over ${formatDurationS(periodS)}; evaluated over the available ${formatDurationS(availableS)} (${valueCount} values)`;
  }
  if (periodCount > 1) return `worst of ${periodCount} consecutive ${formatDurationS(periodS)} periods from the record start`;
  return undefined;
}

/** A rule summary's note: why not evaluated, or how the periods covered the record (stored text for older results). */
export function timeRuleSummaryNote(summary: Pick<TimeRuleSummary, "status" | "cause" | "accumulation" | "measures" | "reason">): string | undefined {
  if (summary.status === "not-evaluated") return summary.cause ? causeText(summary.cause) : summary.reason;
  if (summary.accumulation) return accumulationNote(summary.accumulation);
  return summary.measures ? undefined : summary.reason;
}

/**
 * The threshold sentence of a below-threshold row; with `measuredA` it starts with the row's own
 * value, without it the sentence is the same for every disregarded order.
 */
export function thresholdText(threshold: ThresholdApplied, measuredA?: number): string {
  const fromInputA = (threshold.percentOfInputCurrent / 100) * threshold.inputCurrentA;
  const start = measuredA === undefined ? `below ${formatNumber(threshold.thresholdA)} A` : `${formatNumber(measuredA)} A < ${formatNumber(threshold.thresholdA)} A`;
  return `${start}, the greater of ${threshold.percentOfInputCurrent} % of the input current ${formatNumber(threshold.inputCurrentA)} A (${formatNumber(fromInputA)} A) and ${formatNumber(threshold.minimumA)} A — disregarded`;
}

function watts(x: number | null): string {
  return x === null ? "—" : `${formatNumber(x)} W`;
}

/**
 * Why the limits used the power they used (IEC 61000-3-2 Class C/D), e.g. "declared 600 W
 * differs from the measured 300 W by +100 % (more than ±10 %): the limits use the measured 300 W".
 */
export function powerChoiceText(power: PowerChoice): string {
  const deviation = power.deviationPercent === undefined ? "" : `${power.deviationPercent >= 0 ? "+" : "−"}${formatNumber(Math.abs(power.deviationPercent))} %`;
  const tolerance = `±${formatNumber(power.tolerancePercent)} %`;
  switch (power.rule) {
    case "declared-within-tolerance":
      return `declared ${watts(power.declaredW)} is within ${tolerance} of the measured ${watts(power.measuredW)} (${deviation}): the limits use the declared ${watts(power.usedW)}`;
    case "measured-declared-outside-tolerance":
      return `declared ${watts(power.declaredW)} differs from the measured ${watts(power.measuredW)} by ${deviation} (more than ${tolerance}): the limits use the measured ${watts(power.usedW)}`;
    case "declared-not-measured":
      return `the limits use the declared ${watts(power.declaredW)}: no active power was measured (no voltage channel), so the ${tolerance} check could not be made`;
    case "measured-no-declaration":
      return `no declared power given: the limits use the measured ${watts(power.measuredW)}`;
    case "none":
      return "no declared power given and none measured: limits that depend on rated power cannot be evaluated";
  }
}

/** Declared, measured and used power as label/value pairs for the sheet, PDF and CSV. */
export function powerChoiceRows(power: PowerChoice): Array<[string, string]> {
  return [
    ["Declared power", watts(power.declaredW)],
    ["Measured active power", watts(power.measuredW)],
    ["Power used for the limits", `${watts(power.usedW)} — ${powerChoiceText(power)} (IEC 61000-3-2: the declared power only within ${`±${formatNumber(power.tolerancePercent)} %`} of the measured)`],
  ];
}

/** "2024-03-04 00:00 UTC" — how every date and time reads on a sheet, PDF and CSV. */
export function formatUtc(ms: number): string {
  return `${new Date(ms).toISOString().slice(0, 16).replace("T", " ")} UTC`;
}

/** "a, b and c". */
export function joinAnd(items: string[]): string {
  return items.length <= 1 ? (items[0] ?? "") : `${items.slice(0, -1).join(", ")} and ${items[items.length - 1]}`;
}

/** A band condition's standing (conditions cannot be checked from harmonic magnitudes; an engineer confirms them). */
export function conditionReasonText(condition: Pick<ConditionResult, "verdict">): string {
  return condition.verdict === "pass"
    ? "confirmed by the engineer in the evaluation context (it cannot be checked from harmonic magnitudes)"
    : "cannot be checked from harmonic magnitudes; an engineer confirms it under “Change the context” when it holds";
}

/** Causes that concern the whole record (or the band), the same for every row: the notes explain them once. */
const RECORD_CAUSES = new Set<NotEvaluatedCause["code"]>(["record-too-short", "no-complete-interval", "needs-other-values", "no-order-series", "no-logged-rows", "no-band"]);

/** Rules with the same cause grouped: "“A”, “B” (why); “C” (why)". */
function groupedByCause(results: Array<Pick<RowRuleResult, "label" | "cause">>): string {
  const groups = new Map<string, string[]>();
  for (const result of results) {
    const why = result.cause ? causeText(result.cause) : "could not be evaluated";
    groups.set(why, [...(groups.get(why) ?? []), `“${result.label}”`]);
  }
  return [...groups].map(([why, labels]) => `${labels.join(", ")} (${why})`).join("; ");
}

/**
 * The time rules a row or aggregate could not apply: its own reasons rule by rule (grouped by cause);
 * rules the whole record cannot support (too short, no band…) are pointed to the notes, which say why once.
 *
 * @example rulesNotAppliedText(results) // "1 time rule not applied to this record (see Notes)"
 */
export function rulesNotAppliedText(results: Array<Pick<RowRuleResult, "label" | "cause">>): string | undefined {
  if (results.length === 0) return undefined;
  const own = results.filter((result) => !result.cause || !RECORD_CAUSES.has(result.cause.code));
  const count = (n: number) => (n === 1 ? "1 time rule" : `${n} time rules`);
  if (own.length === 0) return `${count(results.length)} not applied to this record (see Notes)`;
  const rest = results.length - own.length;
  const others = rest > 0 ? `; ${rest === 1 ? "1 other time rule" : `${rest} other time rules`} not applied to this record (see Notes)` : "";
  return `time rules not applied: ${groupedByCause(own)}${others}`;
}

/**
 * The rule that decided a row: its statistic and value against its limit (table × multiplier, or an
 * allowance's), e.g. "decided by “Every 1.5 s smoothed value ≤ 150 % of the limit”: maximum of 1.5 s
 * smoothed values over the observation period = 3.54 A against 1.5 × the table limit 2.3 A = 3.45 A".
 */
export function decidedByRuleText(decider: Pick<RowRuleResult, "label" | "measures" | "statistic" | "measured" | "limit" | "tableLimit" | "multiplier" | "unit">): string {
  const measured = `${formatNumber(decider.measured ?? Number.NaN)} ${decider.unit}`;
  const limit = `${formatNumber(decider.limit ?? Number.NaN)} ${decider.unit}`;
  const scaled = decider.tableLimit !== null && decider.limit !== null && Math.abs(decider.limit - decider.tableLimit * decider.multiplier) <= 1e-9 * Math.max(1e-12, Math.abs(decider.limit));
  const against = scaled
    ? decider.multiplier === 1
      ? `the table limit ${limit}`
      : `${formatNumber(decider.multiplier)} × the table limit ${formatNumber(decider.tableLimit as number)} ${decider.unit} = ${limit}`
    : `the limit raised by an allowance, ${limit}`;
  return `decided by “${decider.label}”: ${ruleStatisticText(decider)} = ${measured} against ${against}`;
}

/**
 * The notes on a channel's time rules: what they were evaluated on, the rules not applied with why
 * (rules with the same cause in one sentence), and what stood in. One sentence each.
 *
 * @example timeRulesNotes(["Daily 99th …"], basis, summary, true)
 * // ["Time rules (“Daily 99th …”): the record gives 2 values of 10/12 cycles (0.4 s of record); …", "“Daily 99th …” was not applied: needs at least 3 s of record; the record has 0.4 s.", …]
 */
export function timeRulesNotes(labels: string[], basis: TimeBasis, summary: TimeRuleSummary[] | undefined, clockMatters: boolean): string[] {
  const count = basis.valueCount;
  const values =
    basis.source === "none"
      ? "no per-window values"
      : `${count} ${basis.source === "windows" ? `value${count === 1 ? "" : "s"} of 10/12 cycles` : `${formatDurationS(basis.valueS ?? 0)} interval-log value${count === 1 ? "" : "s"}`} (${formatDurationS(basis.durationS)} of record)`;
  const clock = !clockMatters ? "" : basis.startMs === null ? "; 10-minute values are counted from the record start, as no start time was given" : "; 10-minute values are aligned to the clock";
  const notes = [`Time rules (${labels.map((label) => `“${label}”`).join(", ")}): the record gives ${values}${clock}.`];
  const skipped = (summary ?? []).filter((rule) => rule.status === "not-evaluated");
  const groups = new Map<string, string[]>();
  for (const rule of skipped) {
    const why = rule.cause ? causeText(rule.cause) : (rule.reason ?? "no values to apply it to");
    groups.set(why, [...(groups.get(why) ?? []), `“${rule.label}”`]);
  }
  for (const [why, rules] of groups) notes.push(`${joinAnd(rules)} ${rules.length === 1 ? "was" : "were"} not applied: ${why}.`);
  // The capture mean stands in only where a band was chosen (without one nothing was judged).
  if (basis.snapshotFallback && skipped.some((rule) => rule.cause?.code !== "no-band")) {
    notes.push("Where a time rule could not be applied, each order's r.m.s. mean over the record was compared with 1.0 × its table limit instead.");
  }
  return notes;
}
