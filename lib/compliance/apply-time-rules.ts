// Time rules (rules.timeRules): statistics of per-window or per-interval series against table
// limit × multiplier. capture-mean.ts gives the table limit and the capture-mean comparison;
// this file adds each rule's judgement and picks the rule that decides the verdict.
import { causeText, decidedByRuleText, loggedThdText, notEvaluatedText, partialSumText, ruleStatisticText, rulesNotAppliedText } from "../reports/result-wording";
import { evaluateTimeRule, ruleMeasures, type TimeRuleOutcome } from "./evaluate-time-rule";
import type { ChannelContext, ChannelTimeSeries, Derived, JudgedWithRules } from "./evaluation-types";
import { aggregateLimitRemark, captureMeanAggregate, captureMeanRow, missingHarmonic } from "./capture-mean";
import type { AggregateRow, Band, Basis, OrderRow, TimeRule } from "./model";
import { pohcAllowance } from "./pohc-allowance";
import { CAPTURE_MEAN_RULE, type ComplianceAggregate, type ComplianceRow, type NotEvaluatedCause, type RowRuleResult } from "./result";
import { expandOrders, toBasis } from "./row-limits";


/** A series in the channel's unit converted to the basis's unit, value by value. */
function seriesToBasis(values: Float64Array, basis: Basis, ctx: ChannelContext): Derived<Float64Array> {
  const fundamental = ctx.time?.fundamental;
  if ((basis === "%I1" || basis === "%V1") && fundamental && fundamental.length === values.length) {
    // Per value against its own fundamental (Class C % of I1; IEEE 519 voltage THD in % of V1).
    const out = new Float64Array(values.length);
    for (let k = 0; k < values.length; k++) out[k] = fundamental[k]! > 0 ? (values[k]! / fundamental[k]!) * 100 : 0;
    return { ok: true, value: out };
  }
  const factor = toBasis(1, basis, ctx);
  if (!factor.ok) return factor;
  const out = new Float64Array(values.length);
  for (let k = 0; k < values.length; k++) out[k] = values[k]! * factor.value;
  return { ok: true, value: out };
}

function rulesFor(ctx: ChannelContext, target: "orders" | "aggregates", name?: string): TimeRule[] {
  if (!ctx.time) return [];
  return ctx.time.rules.filter(
    (rule) => (rule.appliesTo === "all" || rule.appliesTo === target) && (target === "orders" || !rule.aggregates || rule.aggregates.includes(name as AggregateRow["name"])),
  );
}

function notEvaluatedOutcome(rule: TimeRule, tableLimit: number | null, unit: string, cause: NotEvaluatedCause, options: { text?: string; data?: boolean } = {}): TimeRuleOutcome {
  const text = options.text ?? notEvaluatedText(cause);
  return {
    rule: rule.id,
    label: rule.label,
    measures: ruleMeasures(rule),
    measured: null,
    limit: tableLimit === null ? null : tableLimit * rule.multiplier,
    tableLimit,
    multiplier: rule.multiplier,
    unit,
    percentOfLimit: null,
    verdict: "not-evaluated",
    reason: text.startsWith("not evaluated") ? text : `not evaluated: ${text}`,
    cause,
    ...(rule.source ? { source: rule.source } : {}),
    valueCount: 0,
    periodCount: 0,
    ...(options.data ? { dataCause: cause } : {}),
  };
}

/** Apply the rules to a series (channel unit) for a row or aggregate whose capture mean gave `captureMean`. */
function ruleOutcomes(
  rules: TimeRule[],
  captureMean: ComplianceRow | ComplianceAggregate,
  series: Float64Array | null,
  ctx: ChannelContext,
): TimeRuleOutcome[] {
  const time = ctx.time as ChannelTimeSeries;
  const { limit, unit } = captureMean;
  return rules.map((rule) => {
    if (!time.timing) return notEvaluatedOutcome(rule, limit, unit, time.unavailable ?? { code: "no-order-series" }, { data: true });
    if (captureMean.verdict === "not-evaluated" && limit === null) {
      return notEvaluatedOutcome(rule, null, unit, captureMean.cause ?? { code: "no-limit" }, { text: captureMean.reason });
    }
    if (series === null) {
      return notEvaluatedOutcome(rule, limit, unit, captureMean.cause ?? { code: "not-in-record", record: ctx.record }, { text: captureMean.reason });
    }
    const converted = seriesToBasis(series, captureMean.basis, ctx);
    if (!converted.ok) return notEvaluatedOutcome(rule, limit, unit, { code: "missing-input", input: converted.missing });
    return evaluateTimeRule(rule, converted.value, time.timing, limit, unit, ctx.content.rules.comparison.passAtLimit);
  });
}

/** One order: its capture-mean comparison and each applicable time rule's judgement. */
export function judgeOrder(row: OrderRow, h: number, ctx: ChannelContext): JudgedWithRules<ComplianceRow> {
  const captureMean = captureMeanRow(row, h, ctx);
  const rules = rulesFor(ctx, "orders");
  if (rules.length === 0) return { captureMean, ruleResults: null };
  const raw = missingHarmonic(h, ctx) ? null : (ctx.time?.orderSeries(h) ?? null);
  return { captureMean, ruleResults: ruleOutcomes(rules, captureMean, raw, ctx) };
}

/** Per-value sqrt(Σ w_h·X_h²) of an aggregate, or the logged THD where orders are missing. */
function aggregateSeries(aggregate: AggregateRow, ctx: ChannelContext): { values: Float64Array | null; unavailable: number[]; note?: string } {
  const time = ctx.time as ChannelTimeSeries;
  const count = time.timing?.startsS.length ?? 0;
  const sum = new Float64Array(count);
  const unavailable: number[] = [];
  for (const h of expandOrders(aggregate)) {
    const values = missingHarmonic(h, ctx) ? null : time.orderSeries(h);
    if (!values) {
      unavailable.push(h);
      continue;
    }
    const w = aggregate.weighting === "order" ? h : 1;
    for (let k = 0; k < count; k++) sum[k] = sum[k]! + w * values[k]! * values[k]!;
  }
  if (unavailable.length > 0 && time.thdPercent && time.fundamental && (aggregate.name === "THD" || aggregate.name === "TDD") && aggregate.weighting === "none") {
    // Interval logs often carry THD but not every order: distortion = THD × fundamental.
    const values = new Float64Array(count);
    for (let k = 0; k < count; k++) values[k] = (time.thdPercent[k]! / 100) * time.fundamental[k]!;
    return { values, unavailable: [], note: loggedThdText(unavailable) };
  }
  for (let k = 0; k < count; k++) sum[k] = Math.sqrt(sum[k]!);
  return { values: count > 0 ? sum : null, unavailable };
}

/** One aggregate: its capture-mean comparison and each applicable time rule's judgement. */
export function judgeAggregate(aggregate: AggregateRow, band: Band, ctx: ChannelContext): JudgedWithRules<ComplianceAggregate> {
  const captureMean = captureMeanAggregate(aggregate, band, ctx);
  const rules = rulesFor(ctx, "aggregates", aggregate.name);
  if (rules.length === 0) return { captureMean, ruleResults: null };
  const limitRemark = aggregateLimitRemark(aggregate, band, ctx) ?? null;
  if (!ctx.time?.timing) return { captureMean, ruleResults: ruleOutcomes(rules, captureMean, null, ctx), limitRemark };
  const { values, unavailable, note } = aggregateSeries(aggregate, ctx);
  const ruleResults = ruleOutcomes(rules, captureMean, values, ctx).map((outcome) => {
    if (note && outcome.verdict !== "not-evaluated") return { ...outcome, reason: [outcome.reason, note].filter(Boolean).join("; ") };
    if (unavailable.length === 0 || outcome.verdict === "not-evaluated") return outcome;
    // A partial sum only grows with the missing orders: exceeding already is a fail.
    if (outcome.verdict === "fail") return { ...outcome, reason: partialSumText(unavailable, ctx.record, true) };
    const cause: NotEvaluatedCause = { code: "partial-sum", unavailableOrders: unavailable, record: ctx.record };
    return { ...outcome, verdict: "not-evaluated" as const, reason: notEvaluatedText(cause), cause };
  });
  return { captureMean, ruleResults, limitRemark };
}

/** The POHC allowance on each order's time rules that carry `pohcAllowance`. */
export function applyPohcAllowanceToRules(orders: JudgedWithRules<ComplianceRow>[], aggregates: ComplianceAggregate[], ctx: ChannelContext): void {
  const allowance = ctx.content.rules.pohcAllowance;
  if (!allowance || !ctx.time) return;
  const allowing = new Set(ctx.time.rules.filter((rule) => rule.pohcAllowance).map((rule) => rule.id));
  for (const judged of orders) {
    if (!judged.ruleResults) continue;
    judged.ruleResults = judged.ruleResults.map((outcome, index, all) => {
      if (!allowing.has(outcome.rule) || outcome.measured === null || outcome.tableLimit === null) return outcome;
      const othersNotPassing = all.filter((other, i) => i !== index && other.verdict !== "pass").map((other) => `“${other.label}”`);
      const comparison = { order: judged.captureMean.order, measured: outcome.measured, tableLimit: outcome.tableLimit, verdict: outcome.verdict, othersNotPassing };
      const decision = pohcAllowance(comparison, aggregates, allowance);
      if (!decision) return outcome;
      if (decision.verdict === "pass") {
        return { ...outcome, verdict: "pass" as const, limit: decision.allowedLimit, percentOfLimit: (outcome.measured / decision.allowedLimit) * 100, reason: decision.reason };
      }
      if (decision.verdict === "not-evaluated") {
        return { ...outcome, verdict: "not-evaluated" as const, reason: `not evaluated: ${decision.reason}`, cause: { code: "allowance-unchecked" as const, aggregate: allowance.aggregate } };
      }
      return { ...outcome, reason: decision.reason };
    });
  }
}

function toRowRule(outcome: TimeRuleOutcome): RowRuleResult {
  const { dataCause: _internal, ...rest } = outcome;
  return rest;
}

function captureMeanRuleResult(captureMean: ComplianceRow | ComplianceAggregate, windows: number): RowRuleResult {
  return {
    rule: CAPTURE_MEAN_RULE,
    label: "Capture r.m.s. mean ≤ limit",
    statistic: ruleStatisticText({ measures: { kind: "capture-mean", windowCount: windows } }),
    measures: { kind: "capture-mean", windowCount: windows },
    measured: captureMean.measured,
    limit: captureMean.limit,
    tableLimit: captureMean.limit,
    multiplier: 1,
    unit: captureMean.unit,
    percentOfLimit: captureMean.percentOfLimit,
    verdict: captureMean.verdict === "below-threshold" ? "pass" : captureMean.verdict,
    ...(captureMean.reason ? { reason: captureMean.reason } : {}),
    ...(captureMean.cause ? { cause: captureMean.cause } : {}),
  };
}

/**
 * The row's verdict from its rules: any failing rule fails it (the one furthest over its limit
 * decides); otherwise all evaluated rules pass (the one closest to its limit decides). Rules that
 * cannot be evaluated are listed; for analysis captures the capture-mean comparison stands in.
 */
export function decideByRules<T extends ComplianceRow | ComplianceAggregate>(judged: JudgedWithRules<T>, ctx: ChannelContext): T {
  const { captureMean, ruleResults } = judged;
  if (!ruleResults) return captureMean;
  const rowRules = ruleResults.map(toRowRule);
  if (captureMean.verdict === "below-threshold") return { ...captureMean, rowRules, decidedBy: "threshold" };
  const considered: RowRuleResult[] = rowRules.filter((result) => result.verdict !== "not-evaluated");
  const fallback = (ctx.time as ChannelTimeSeries).captureMeanFallback;
  if (considered.length < rowRules.length && fallback) {
    const stand = captureMeanRuleResult(captureMean, ctx.windowCount);
    rowRules.push(stand);
    if (stand.verdict !== "not-evaluated") considered.push(stand);
  }
  if (considered.length === 0) {
    if (fallback) return { ...captureMean, rowRules, decidedBy: CAPTURE_MEAN_RULE };
    const causes = rowRules.map((result) => result.cause).filter((cause): cause is NotEvaluatedCause => cause !== undefined);
    const words = [...new Set(causes.map(causeText))];
    const own = captureMean.verdict === "not-evaluated" && captureMean.reason;
    const reason = own ? captureMean.reason : `not evaluated: ${words.join("; ")}`;
    const cause = (own ? captureMean.cause : undefined) ?? causes[0];
    return { ...captureMean, percentOfLimit: null, margin: null, verdict: "not-evaluated", reason, rowRules, ...(cause ? { cause } : {}) };
  }
  const failing = considered.filter((result) => result.verdict === "fail");
  const pool = failing.length > 0 ? failing : considered;
  const decider = pool.reduce((best, result) => ((result.percentOfLimit ?? -Infinity) > (best.percentOfLimit ?? -Infinity) ? result : best));
  const skippedText = rulesNotAppliedText(rowRules.filter((result) => result.verdict === "not-evaluated" && result.rule !== CAPTURE_MEAN_RULE));
  if (decider.rule === CAPTURE_MEAN_RULE) {
    const standIn = skippedText ? `${skippedText} — judged by the r.m.s. mean over the record instead` : undefined;
    const reason = [captureMean.reason, standIn].filter(Boolean).join("; ");
    return { ...captureMean, rowRules, decidedBy: CAPTURE_MEAN_RULE, ...(reason ? { reason } : {}) };
  }
  const measured = decider.measured as number;
  const limit = decider.limit as number;
  // The capture mean's own remarks (e.g. an aggregate summed without some orders) concern a value this verdict did not use.
  const limitRemark = judged.limitRemark !== undefined ? judged.limitRemark : captureMean.verdict !== "not-evaluated" ? captureMean.reason : undefined;
  const reason = [decidedByRuleText(decider), decider.reason, limitRemark, skippedText].filter(Boolean).join("; ");
  return {
    ...captureMean,
    measured,
    limit,
    percentOfLimit: decider.percentOfLimit,
    margin: limit - measured,
    verdict: failing.length > 0 ? "fail" : "pass",
    reason,
    rowRules,
    decidedBy: decider.rule,
  };
}
