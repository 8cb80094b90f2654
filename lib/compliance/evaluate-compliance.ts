// The pure compliance evaluator: analysis result + limit-set revision + context → per-order
// verdicts, aggregates and an overall verdict, with a reason wherever something is not a plain
// pass. Missing information never turns into a pass.
import type { AnalysisResult, ChannelResult, HarmonicValue } from "../analysis/types";
import { approxEqual } from "./approx-equal";
import { formatDurationS, type TimeSeriesTiming } from "./derive-rule-values";
import { evaluateFormula } from "./evaluate-formula";
import { evaluateTimeRule, type TimeRuleOutcome } from "./evaluate-time-rule";
import { interpolateBand } from "./interpolate-band";
import {
  EvaluationContextSchema,
  LimitSetRevisionContentSchema,
  type AggregateRow,
  type Band,
  type Basis,
  type EvaluationContext,
  type LimitSetRevisionContent,
  type LimitSetRevisionContentInput,
  type OrderRow,
  type TimeRule,
} from "./model";
import { orderMatchesParity } from "./order-matches-parity";
import { FormulaVariableError, type FormulaVariable } from "./parse-formula";
import type {
  BandChoice,
  ChannelCompliance,
  ComplianceAggregate,
  ComplianceResult,
  ComplianceRow,
  ConditionResult,
  OverallVerdict,
  RowRuleResult,
  TimeBasis,
  TimeRuleSummary,
} from "./result";
import { selectBand } from "./select-band";

export interface EvaluateComplianceInput {
  analysis: AnalysisResult;
  /** Evaluate only this channel (its header name); default: every channel of the set's quantity. */
  channel?: string;
  limitSet: {
    key: string;
    name: string;
    revision: { id: string | number; number: number };
    content: LimitSetRevisionContent | LimitSetRevisionContentInput;
  };
  context: EvaluationContext;
  /** Start of the first window, ms since the epoch: 10-minute values then align to the clock (else to the record start). */
  recordStartMs?: number;
  /** Time series that replace the analysis's window series — interval logs (see evaluateIntervalLog). */
  timeSeries?: TimeSeriesInput;
}

/** Per-channel value series on one time base, e.g. the rows of an interval log. */
export interface TimeSeriesInput {
  source: "interval-log";
  /** Duration of one value, s (e.g. 600 for 10-minute values). */
  valueS: number;
  /** Start of each value, s since the epoch. */
  startsS: Float64Array;
  /** Keyed by channel name; values in A or V per order (order 1 = fundamental), THD in %. */
  channels: Record<string, { orders: Map<number, Float64Array>; thdPercent?: Float64Array }>;
  /** How the record is named in reasons, e.g. "the interval log". */
  noun: string;
}

/** Time-rule facts of one channel; null when the revision has no time rules. */
interface ChannelTime {
  rules: TimeRule[];
  /** Null when there is no series (`unavailable` says why). */
  timing: TimeSeriesTiming | null;
  unavailable?: string;
  /** Analysis captures: the capture-mean comparison stands in for rules that cannot be evaluated. */
  snapshotFallback: boolean;
  orderSeries: (h: number) => Float64Array | null;
  fundamental: Float64Array | null;
  thdPercent: Float64Array | null;
  basis: TimeBasis;
}

const VARIABLE_NEEDS: Record<FormulaVariable, string> = {
  h: "h (harmonic order)",
  P: "ratedPowerW (rated power, W)",
  lambda: "lambda (circuit power factor)",
};

/** Per-channel facts the rows and aggregates are computed from. */
interface ChannelEnv {
  channel: ChannelResult;
  harmonics: Map<number, HarmonicValue>;
  analysedUpTo: number;
  maxResolvableOrder: number;
  content: LimitSetRevisionContent;
  context: EvaluationContext;
  lambda?: number;
  irefA?: number;
  notes: string[];
  time: ChannelTime | null;
  /** How the source is named in "not in …" reasons. */
  noun: string;
  windowCount: number;
}

type Outcome<T> = { ok: true; value: T; text?: string } | { ok: false; missing: string };

function fmt(x: number): string {
  if (x === 0) return "0";
  const magnitude = Math.abs(x);
  return magnitude >= 1000 || magnitude < 0.001 ? x.toPrecision(4) : String(Number(x.toPrecision(4)));
}

function unitOf(basis: Basis): string {
  return basis === "mA/W" ? "A" : basis;
}

/** Convert a value in the channel's unit (A or V) to the basis's unit. */
function toBasis(value: number, basis: Basis, env: ChannelEnv): Outcome<number> {
  switch (basis) {
    case "A":
    case "mA/W":
      return { ok: true, value };
    case "%I1":
    case "%V1":
      return env.channel.fundamentalRms > 0
        ? { ok: true, value: (value / env.channel.fundamentalRms) * 100 }
        : { ok: false, missing: "a non-zero measured fundamental" };
    case "%IL":
      return env.context.ilA !== undefined
        ? { ok: true, value: (value / env.context.ilA) * 100 }
        : { ok: false, missing: "ilA (maximum demand load current at the PCC)" };
    case "%Iref":
      return env.irefA !== undefined && env.irefA > 0
        ? { ok: true, value: (value / env.irefA) * 100 }
        : { ok: false, missing: "irefA (reference current)" };
    case "%Vnom":
      return env.context.nominalVoltageV !== undefined
        ? { ok: true, value: (value / env.context.nominalVoltageV) * 100 }
        : { ok: false, missing: "nominalVoltageV (nominal voltage of the measured channel)" };
  }
}

function evaluateValue(limit: number | undefined, formula: string | undefined, variables: Record<string, number | undefined>): Outcome<number> {
  try {
    return { ok: true, value: limit ?? evaluateFormula(formula as string, variables) };
  } catch (error) {
    if (error instanceof FormulaVariableError) return { ok: false, missing: VARIABLE_NEEDS[error.variable] };
    throw error;
  }
}

/** The limit of one order in the unit of the row (amperes for mA/W rows), with how it was obtained. */
function rowLimit(row: OrderRow, h: number, env: ChannelEnv): Outcome<number> {
  const P = env.context.ratedPowerW;
  const base = evaluateValue(row.limit, row.formula, { h, P, lambda: env.lambda });
  if (!base.ok) return base;
  let value = base.value;
  const parts: string[] = [];
  if (row.formula !== undefined) parts.push(`${row.formula} at h = ${h}${row.formula.includes("lambda") && env.lambda !== undefined ? `, λ = ${fmt(env.lambda)}` : ""}`);
  if (row.basis === "mA/W") {
    if (P === undefined) return { ok: false, missing: VARIABLE_NEEDS.P };
    value = (base.value * P) / 1000;
    parts.push(`${fmt(base.value)} mA/W × ${P} W = ${fmt(value)} A`);
  }
  if (row.capA !== undefined || row.capFormulaA !== undefined) {
    const cap = evaluateValue(row.capA, row.capFormulaA, { h });
    if (!cap.ok) return cap;
    if (cap.value < value) {
      parts.push(`capped at the absolute maximum ${fmt(cap.value)} A (the lower figure)`);
      value = cap.value;
    } else parts.push(`absolute maximum ${fmt(cap.value)} A not reached`);
  }
  if (row.note) parts.push(row.note);
  return { ok: true, value, text: parts.length > 0 ? parts.join("; ") : undefined };
}

function judge(measured: number, limit: number, passAtLimit: boolean): "pass" | "fail" {
  if (approxEqual(measured, limit)) return passAtLimit ? "pass" : "fail";
  return measured < limit ? "pass" : "fail";
}

function percentOf(measured: number | null, limit: number | null): number | null {
  if (measured === null || limit === null || limit <= 0) return null;
  return (measured / limit) * 100;
}

/** Measured against limit: % of limit and the headroom (limit − measured), null where either is unknown. */
function comparison(measured: number | null, limit: number | null) {
  return {
    measured,
    limit,
    percentOfLimit: percentOf(measured, limit),
    margin: measured !== null && limit !== null ? limit - measured : null,
  };
}

function expandOrders(row: { from: number; to: number; parity: OrderRow["parity"] }): number[] {
  const orders: number[] = [];
  for (let h = row.from; h <= row.to; h += 1) if (orderMatchesParity(h, row.parity)) orders.push(h);
  return orders;
}

function missingHarmonic(h: number, env: ChannelEnv): string | null {
  const harmonic = env.harmonics.get(h);
  if (harmonic && harmonic.rms !== null) return null;
  // The reasons name no order (the row does), so the sheet can list each distinct reason once.
  if (h > env.maxResolvableOrder || (harmonic && harmonic.rms === null)) {
    return `above Nyquist (highest resolvable order ${env.maxResolvableOrder})`;
  }
  if (env.noun !== "the analysis") return `not in ${env.noun}`;
  return `not in the analysis (orders analysed up to ${env.analysedUpTo})`;
}

function snapshotRow(row: OrderRow, h: number, env: ChannelEnv): ComplianceRow {
  const unit = unitOf(row.basis);
  const base = { order: h, unit, basis: row.basis, limitSource: row.source };
  const limit = rowLimit(row, h, env);
  const limitValue = limit.ok ? limit.value : null;
  const notMeasured = missingHarmonic(h, env);
  if (notMeasured) {
    return { ...base, measured: null, limit: limitValue, percentOfLimit: null, margin: null, verdict: "not-evaluated", reason: notMeasured };
  }
  const rms = (env.harmonics.get(h) as HarmonicValue).rms as number;
  const measured = toBasis(rms, row.basis, env);
  const measuredValue = measured.ok ? measured.value : null;
  const shown = { ...base, ...comparison(measuredValue, limitValue) };

  // IEC 61000-3-2: small currents are disregarded whatever their limit.
  const threshold = env.content.rules.threshold;
  if (threshold && env.channel.quantity === "current") {
    const fromInputA = (threshold.percentOfInputCurrent / 100) * env.channel.rms;
    const thresholdA = Math.max(fromInputA, threshold.minimumA);
    if (rms < thresholdA) {
      return {
        ...shown,
        verdict: "below-threshold",
        reason: `${fmt(rms)} A < ${fmt(thresholdA)} A, the greater of ${threshold.percentOfInputCurrent} % of the input current ${fmt(env.channel.rms)} A (${fmt(fromInputA)} A) and ${fmt(threshold.minimumA)} A — disregarded`,
      };
    }
  }
  if (!limit.ok) return { ...shown, verdict: "not-evaluated", reason: `not evaluated: ${limit.missing} not given` };
  if (!measured.ok) return { ...shown, verdict: "not-evaluated", reason: `not evaluated: ${measured.missing} not given` };
  const verdict = judge(measured.value, limit.value, env.content.rules.comparison.passAtLimit);
  const atLimit = approxEqual(measured.value, limit.value) ? "exactly at the limit: passes (measured ≤ limit)" : undefined;
  const reason = [limit.text, atLimit].filter(Boolean).join("; ");
  return { ...shown, verdict, ...(reason ? { reason } : {}) };
}

/** sqrt(Σ w_h·X_h²) over the aggregate's orders, with the orders that were unavailable. */
function sumOrders(aggregate: AggregateRow, valueOf: (h: number) => number | null): { total: number; unavailable: number[] } {
  let sum = 0;
  const unavailable: number[] = [];
  for (const h of expandOrders(aggregate)) {
    const value = valueOf(h);
    if (value === null) {
      unavailable.push(h);
      continue;
    }
    sum += (aggregate.weighting === "order" ? h : 1) * value * value;
  }
  return { total: Math.sqrt(sum), unavailable };
}

function describeOrders(orders: number[]): string {
  if (orders.length <= 3) return orders.join(", ");
  return `${orders[0]}–${orders[orders.length - 1]} (${orders.length} orders)`;
}

function aggregateLimit(aggregate: AggregateRow, band: Band, env: ChannelEnv): Outcome<number> {
  if (aggregate.fromOrderLimits) {
    // Same sum as the measured quantity, applied to the per-order limits in amperes.
    let sum = 0;
    for (const h of expandOrders(aggregate)) {
      const row = band.orderRows.find((candidate) => candidate.from <= h && h <= candidate.to && orderMatchesParity(h, candidate.parity));
      if (!row) continue;
      if (row.basis !== "A" && row.basis !== "mA/W") return { ok: false, missing: "ampere limits for every order (fromOrderLimits)" };
      const limit = rowLimit(row, h, env);
      if (!limit.ok) return limit;
      sum += (aggregate.weighting === "order" ? h : 1) * limit.value * limit.value;
    }
    const value = Math.sqrt(sum);
    return { ok: true, value, text: `limit = ${aggregate.name} of the order limits ${describeOrders(expandOrders(aggregate))} = ${fmt(value)} A` };
  }
  const base = evaluateValue(aggregate.limit, aggregate.formula, { P: env.context.ratedPowerW, lambda: env.lambda });
  if (!base.ok || aggregate.basis !== "mA/W") return base;
  const P = env.context.ratedPowerW;
  if (P === undefined) return { ok: false, missing: VARIABLE_NEEDS.P };
  const value = (base.value * P) / 1000;
  return { ok: true, value, text: `${fmt(base.value)} mA/W × ${P} W = ${fmt(value)} A` };
}

function snapshotAggregate(aggregate: AggregateRow, band: Band, env: ChannelEnv): ComplianceAggregate {
  const unit = unitOf(aggregate.basis);
  const base = { name: aggregate.name, unit, basis: aggregate.basis, role: aggregate.role, limitSource: aggregate.source };
  const limit = aggregateLimit(aggregate, band, env);
  const limitValue = limit.ok ? limit.value : null;
  const { total, unavailable } = sumOrders(aggregate, (h) => (missingHarmonic(h, env) ? null : ((env.harmonics.get(h) as HarmonicValue).rms as number)));
  const measured = toBasis(total, aggregate.basis, env);
  const measuredValue = measured.ok ? measured.value : null;
  const shown = { ...base, ...comparison(measuredValue, limitValue) };
  const roleNote = aggregate.role === "allowance-condition" ? "allowance condition only, not itself a requirement" : undefined;
  const withRole = (text: string): string => [text, roleNote].filter(Boolean).join("; ");
  if (!limit.ok) return { ...shown, verdict: "not-evaluated", reason: withRole(`not evaluated: ${limit.missing} not given`) };
  if (!measured.ok) return { ...shown, verdict: "not-evaluated", reason: withRole(`not evaluated: ${measured.missing} not given`) };
  const verdict = judge(measured.value, limit.value, env.content.rules.comparison.passAtLimit);
  const detail = [limit.text, aggregate.note].filter(Boolean).join("; ");
  if (unavailable.length > 0) {
    const gap = `orders ${describeOrders(unavailable)} unavailable (above Nyquist or not analysed)`;
    // A partial sum only grows with the missing orders: exceeding the limit already is a fail.
    if (verdict === "fail") return { ...shown, verdict: "fail", reason: withRole(`${gap}; the partial value already exceeds the limit`) };
    return { ...shown, verdict: "not-evaluated", reason: withRole(`${gap}; the partial value cannot show compliance`) };
  }
  const reason = withRole(detail);
  return { ...shown, verdict, ...(reason ? { reason } : {}) };
}

// ---------------------------------------------------------------------------------------------
// Time rules (rules.timeRules): statistics of per-window or per-interval series against
// table limit × multiplier. The snapshot functions above give the table limit and the
// capture-mean comparison; the functions below add each rule's judgement and pick the decider.

/** One order's or aggregate's snapshot result and its time-rule outcomes (null: no rule applies). */
interface Parts<T> {
  snapshot: T;
  outcomes: TimeRuleOutcome[] | null;
}

/** A series in the channel's unit converted to the basis's unit, value by value. */
function seriesToBasis(values: Float64Array, basis: Basis, env: ChannelEnv): Outcome<Float64Array> {
  const fundamental = env.time?.fundamental;
  if ((basis === "%I1" || basis === "%V1") && fundamental && fundamental.length === values.length) {
    // Per value against its own fundamental (Class C % of I1; IEEE 519 voltage THD in % of V1).
    const out = new Float64Array(values.length);
    for (let k = 0; k < values.length; k++) out[k] = fundamental[k]! > 0 ? (values[k]! / fundamental[k]!) * 100 : 0;
    return { ok: true, value: out };
  }
  const factor = toBasis(1, basis, env);
  if (!factor.ok) return factor;
  const out = new Float64Array(values.length);
  for (let k = 0; k < values.length; k++) out[k] = values[k]! * factor.value;
  return { ok: true, value: out };
}

function rulesFor(env: ChannelEnv, target: "orders" | "aggregates", name?: string): TimeRule[] {
  if (!env.time) return [];
  return env.time.rules.filter(
    (rule) => (rule.appliesTo === "all" || rule.appliesTo === target) && (target === "orders" || !rule.aggregates || rule.aggregates.includes(name as AggregateRow["name"])),
  );
}

function notEvaluatedOutcome(rule: TimeRule, tableLimit: number | null, unit: string, reason: string, dataReason?: string): TimeRuleOutcome {
  return {
    rule: rule.id,
    label: rule.label,
    statistic: "",
    measured: null,
    limit: tableLimit === null ? null : tableLimit * rule.multiplier,
    tableLimit,
    multiplier: rule.multiplier,
    unit,
    percentOfLimit: null,
    verdict: "not-evaluated",
    reason: reason.startsWith("not evaluated") ? reason : `not evaluated: ${reason}`,
    ...(rule.source ? { source: rule.source } : {}),
    valueCount: 0,
    periodCount: 0,
    ...(dataReason ? { dataReason } : {}),
  };
}

/** Apply the rules to a series (channel unit) for a row or aggregate whose snapshot gave `snapshot`. */
function ruleOutcomes(
  rules: TimeRule[],
  snapshot: { limit: number | null; unit: string; basis: Basis; verdict: string; reason?: string },
  series: Outcome<Float64Array> | null,
  env: ChannelEnv,
): TimeRuleOutcome[] {
  const time = env.time as ChannelTime;
  return rules.map((rule) => {
    if (!time.timing) return notEvaluatedOutcome(rule, snapshot.limit, snapshot.unit, time.unavailable ?? "no time series", time.unavailable);
    if (snapshot.verdict === "not-evaluated" && snapshot.limit === null) {
      return notEvaluatedOutcome(rule, null, snapshot.unit, snapshot.reason ?? "no limit");
    }
    if (series === null) return notEvaluatedOutcome(rule, snapshot.limit, snapshot.unit, snapshot.reason ?? "no series for this row");
    if (!series.ok) return notEvaluatedOutcome(rule, snapshot.limit, snapshot.unit, `${series.missing} not given`);
    const converted = seriesToBasis(series.value, snapshot.basis, env);
    if (!converted.ok) return notEvaluatedOutcome(rule, snapshot.limit, snapshot.unit, `${converted.missing} not given`);
    return evaluateTimeRule(rule, converted.value, time.timing, snapshot.limit, snapshot.unit, env.content.rules.comparison.passAtLimit);
  });
}

function orderParts(row: OrderRow, h: number, env: ChannelEnv): Parts<ComplianceRow> {
  const snapshot = snapshotRow(row, h, env);
  const rules = rulesFor(env, "orders");
  if (rules.length === 0) return { snapshot, outcomes: null };
  const missing = missingHarmonic(h, env);
  const raw = env.time?.orderSeries(h) ?? null;
  const series: Outcome<Float64Array> | null = missing || !raw ? null : { ok: true, value: raw };
  return { snapshot, outcomes: ruleOutcomes(rules, snapshot, series, env) };
}

/** Per-value sqrt(Σ w_h·X_h²) of an aggregate, or the logged THD where orders are missing. */
function aggregateSeries(aggregate: AggregateRow, env: ChannelEnv): { values: Float64Array | null; unavailable: number[]; note?: string } {
  const time = env.time as ChannelTime;
  const count = time.timing?.startsS.length ?? 0;
  const sum = new Float64Array(count);
  const unavailable: number[] = [];
  for (const h of expandOrders(aggregate)) {
    const values = missingHarmonic(h, env) ? null : time.orderSeries(h);
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
    return { values, unavailable: [], note: `from the logged THD column × fundamental (the logger's order range; orders ${describeOrders(unavailable)} not logged individually)` };
  }
  for (let k = 0; k < count; k++) sum[k] = Math.sqrt(sum[k]!);
  return { values: count > 0 ? sum : null, unavailable };
}

function aggregateParts(aggregate: AggregateRow, band: Band, env: ChannelEnv): Parts<ComplianceAggregate> {
  const snapshot = snapshotAggregate(aggregate, band, env);
  const rules = rulesFor(env, "aggregates", aggregate.name);
  if (rules.length === 0) return { snapshot, outcomes: null };
  if (!env.time?.timing) return { snapshot, outcomes: ruleOutcomes(rules, snapshot, null, env) };
  const { values, unavailable, note } = aggregateSeries(aggregate, env);
  const outcomes = ruleOutcomes(rules, snapshot, values ? { ok: true, value: values } : null, env).map((outcome) => {
    if (note && outcome.verdict !== "not-evaluated") return { ...outcome, reason: [outcome.reason, note].filter(Boolean).join("; ") };
    if (unavailable.length === 0 || outcome.verdict === "not-evaluated") return outcome;
    const gap = `orders ${describeOrders(unavailable)} unavailable (above Nyquist or not in ${env.noun})`;
    // A partial sum only grows with the missing orders: exceeding already is a fail.
    if (outcome.verdict === "fail") return { ...outcome, reason: `${gap}; the partial value already exceeds the limit` };
    return { ...outcome, verdict: "not-evaluated" as const, reason: `not evaluated: ${gap}; the partial value cannot show compliance` };
  });
  return { snapshot, outcomes };
}

function toRowRule(outcome: TimeRuleOutcome): RowRuleResult {
  const { dataReason: _internal, ...rest } = outcome;
  return rest;
}

function snapshotRule(snapshot: ComplianceRow | ComplianceAggregate, windows: number): RowRuleResult {
  return {
    rule: "snapshot",
    label: "Capture r.m.s. mean ≤ limit",
    statistic: `r.m.s. mean over the capture's ${windows} window(s)`,
    measured: snapshot.measured,
    limit: snapshot.limit,
    tableLimit: snapshot.limit,
    multiplier: 1,
    unit: snapshot.unit,
    percentOfLimit: snapshot.percentOfLimit,
    verdict: snapshot.verdict === "below-threshold" ? "pass" : snapshot.verdict,
    ...(snapshot.reason ? { reason: snapshot.reason } : {}),
  };
}

/**
 * The row's verdict from its rules: any failing rule fails it (the one furthest over its limit
 * decides); otherwise all evaluated rules pass (the one closest to its limit decides). Rules that
 * cannot be evaluated are listed; for analysis captures the snapshot comparison stands in.
 */
function combineParts<T extends ComplianceRow | ComplianceAggregate>(parts: Parts<T>, env: ChannelEnv, windows: number): T {
  const { snapshot, outcomes } = parts;
  if (!outcomes) return snapshot;
  const rowRules = outcomes.map(toRowRule);
  if (snapshot.verdict === "below-threshold") return { ...snapshot, rowRules, decidedBy: "threshold" };
  const considered: RowRuleResult[] = rowRules.filter((result) => result.verdict !== "not-evaluated");
  const fallback = (env.time as ChannelTime).snapshotFallback;
  if (considered.length < rowRules.length && fallback) {
    const stand = snapshotRule(snapshot, windows);
    rowRules.push(stand);
    if (stand.verdict !== "not-evaluated") considered.push(stand);
  }
  if (considered.length === 0) {
    if (fallback) return { ...snapshot, rowRules, decidedBy: "snapshot" };
    const reasons = [...new Set(rowRules.map((result) => (result.reason ?? "").replace(/^not evaluated: /, "")))].filter(Boolean);
    const reason = snapshot.verdict === "not-evaluated" && snapshot.reason ? snapshot.reason : `not evaluated: ${reasons.join("; ")}`;
    return { ...snapshot, percentOfLimit: null, margin: null, verdict: "not-evaluated", reason, rowRules };
  }
  const failing = considered.filter((result) => result.verdict === "fail");
  const pool = failing.length > 0 ? failing : considered;
  const decider = pool.reduce((best, result) => ((result.percentOfLimit ?? -Infinity) > (best.percentOfLimit ?? -Infinity) ? result : best));
  const skipped = rowRules.filter((result) => result.verdict === "not-evaluated" && result.rule !== "snapshot").map((result) => result.rule);
  const skippedText = skipped.length > 0 ? `not evaluated: ${skipped.join(", ")} (see rowRules)` : undefined;
  if (decider.rule === "snapshot") {
    const reason = [snapshot.reason, skippedText].filter(Boolean).join("; ");
    return { ...snapshot, rowRules, decidedBy: "snapshot", ...(reason ? { reason } : {}) };
  }
  const measured = decider.measured as number;
  const limit = decider.limit as number;
  const tableLimitText = decider.tableLimit !== null ? fmt(decider.tableLimit) : "?";
  const decidedText = `decided by "${decider.label}": ${decider.statistic} = ${fmt(measured)} ${decider.unit} vs ${limit === (decider.tableLimit ?? 0) * decider.multiplier ? `${decider.multiplier} × ${tableLimitText}` : "allowance"} = ${fmt(limit)} ${decider.unit}`;
  const reason = [decidedText, decider.reason, snapshot.verdict !== "not-evaluated" ? snapshot.reason : undefined, skippedText].filter(Boolean).join("; ");
  return {
    ...snapshot,
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

/**
 * IEC 61000-3-2 POHC allowance on the time rules (from memory): an odd order 21–39 whose
 * smoothed average exceeds its limit passes if the average is within factor × the limit, the
 * measured POHC (itself judged by its time rules) passes, and every other rule of the order
 * (every 1.5 s smoothed value ≤ 150 %) passes.
 */
function applyTimePohcAllowance(rows: Parts<ComplianceRow>[], aggregates: ComplianceAggregate[], env: ChannelEnv): void {
  const allowance = env.content.rules.pohcAllowance;
  if (!allowance || !env.time) return;
  const pohc = aggregates.find((aggregate) => aggregate.name === allowance.aggregate);
  const allowing = new Set(env.time.rules.filter((rule) => rule.pohcAllowance).map((rule) => rule.id));
  for (const parts of rows) {
    const h = parts.snapshot.order;
    if (!parts.outcomes || h < allowance.from || h > allowance.to || !orderMatchesParity(h, allowance.parity)) continue;
    parts.outcomes = parts.outcomes.map((outcome, index, all) => {
      if (!allowing.has(outcome.rule) || outcome.verdict !== "fail" || outcome.measured === null || outcome.tableLimit === null) return outcome;
      const allowedLimit = outcome.tableLimit * allowance.factor;
      if (judge(outcome.measured, allowedLimit, true) === "fail") return outcome;
      const text = `exceeds the limit but is within ${allowance.factor * 100} % of it`;
      const others = all.filter((_, other) => other !== index);
      const othersFail = others.filter((other) => other.verdict !== "pass").map((other) => other.rule);
      if (othersFail.length > 0) return { ...outcome, reason: `${text}, but ${othersFail.join(", ")} did not pass, so the ${allowance.aggregate} allowance does not apply` };
      if (pohc?.verdict === "pass") {
        return {
          ...outcome,
          verdict: "pass" as const,
          limit: allowedLimit,
          percentOfLimit: (outcome.measured / allowedLimit) * 100,
          reason: `${text}; ${allowance.aggregate} ${fmt(pohc.measured as number)} A ≤ ${fmt(pohc.limit as number)} A and every other rule passes: allowance applies`,
        };
      }
      if (pohc?.verdict === "not-evaluated") {
        return { ...outcome, verdict: "not-evaluated" as const, reason: `not evaluated: ${text}; the ${allowance.aggregate} allowance could not be checked (${pohc.reason ?? ""})` };
      }
      return { ...outcome, reason: `${text} but ${allowance.aggregate} exceeds its limit, so the allowance does not apply` };
    });
  }
}

/** Per rule: applied or not on this channel, from the chosen band's rows and aggregates. */
function summarizeTimeRules(rows: ComplianceRow[], aggregates: ComplianceAggregate[], env: ChannelEnv): TimeRuleSummary[] | undefined {
  if (!env.time) return undefined;
  const results = [...rows, ...aggregates].flatMap((row) => row.rowRules ?? []);
  return env.time.rules.map((rule): TimeRuleSummary => {
    const mine = results.filter((result) => result.rule === rule.id);
    const evaluated = mine.filter((result) => result.verdict !== "not-evaluated");
    const notes = evaluated.map((result) => result.reason).find((reason) => reason?.includes("accumulates") || reason?.includes("periods from"));
    const firstReason = mine.find((result) => result.verdict === "not-evaluated")?.reason?.replace(/^not evaluated: /, "");
    const reason = evaluated.length > 0 ? notes?.split("; ").find((part) => part.includes("accumulates") || part.includes("periods from")) : firstReason ?? env.time?.unavailable ?? "no rows or aggregates it applies to";
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

function evaluateConditions(band: Band, context: EvaluationContext): ConditionResult[] {
  const asserted = new Set(context.assertedConditions ?? []);
  return band.conditions.map((condition) =>
    asserted.has(condition.id)
      ? { id: condition.id, text: condition.text, verdict: "pass", reason: "asserted by the user (context.assertedConditions)" }
      : {
          id: condition.id,
          text: condition.text,
          verdict: "not-evaluated",
          reason: `cannot be checked from harmonic magnitudes; assert it with the id "${condition.id}" if it holds`,
        },
  );
}

function channelVerdict(rows: ComplianceRow[], aggregates: ComplianceAggregate[], conditions: ConditionResult[]): OverallVerdict {
  const required = aggregates.filter((aggregate) => aggregate.role === "requirement");
  if (rows.some((row) => row.verdict === "fail") || required.some((aggregate) => aggregate.verdict === "fail")) return "fail";
  if (
    rows.some((row) => row.verdict === "not-evaluated") ||
    required.some((aggregate) => aggregate.verdict === "not-evaluated") ||
    conditions.some((condition) => condition.verdict === "not-evaluated")
  ) {
    return "incomplete";
  }
  return "pass";
}

/** IEC 61000-3-2 POHC allowance: a failing order in the range may pass if ≤ factor × limit and POHC passes. */
function applyPohcAllowance(rows: ComplianceRow[], aggregates: ComplianceAggregate[], env: ChannelEnv): ComplianceRow[] {
  const rule = env.content.rules.pohcAllowance;
  if (!rule) return rows;
  const pohc = aggregates.find((aggregate) => aggregate.name === rule.aggregate);
  return rows.map((row) => {
    const inRange = row.order >= rule.from && row.order <= rule.to && orderMatchesParity(row.order, rule.parity);
    // Rows decided by a time rule had the allowance applied there (applyTimePohcAllowance).
    const byTimeRule = row.decidedBy !== undefined && row.decidedBy !== "snapshot";
    if (!inRange || byTimeRule || row.verdict !== "fail" || row.measured === null || row.limit === null) return row;
    const withinFactor = judge(row.measured, row.limit * rule.factor, true) === "pass";
    if (!withinFactor) return row;
    const allowance = `exceeds the limit but is within ${rule.factor * 100} % of it`;
    if (pohc?.verdict === "pass") {
      return {
        ...row,
        verdict: "pass",
        reason: `${allowance} and ${rule.aggregate} ${fmt(pohc.measured as number)} A ≤ ${fmt(pohc.limit as number)} A: allowance applies`,
      };
    }
    if (pohc?.verdict === "not-evaluated") {
      return { ...row, verdict: "not-evaluated", reason: `${allowance}; the ${rule.aggregate} allowance could not be checked (${pohc.reason ?? ""})` };
    }
    return { ...row, reason: `${allowance} but ${rule.aggregate} exceeds its limit, so the allowance does not apply` };
  });
}

interface BandEvaluation {
  label: string;
  description?: string;
  rows: ComplianceRow[];
  aggregates: ComplianceAggregate[];
  conditions: ConditionResult[];
  verdict: OverallVerdict;
}

function evaluateBand(band: Band, env: ChannelEnv): BandEvaluation {
  const interpolated = interpolateBand(env.content, band, env.context);
  const used = interpolated?.band ?? band;
  if (used.exempt) {
    return { label: used.label, description: "no limits apply in this band", rows: [], aggregates: [], conditions: [], verdict: "pass" };
  }
  const entries = used.orderRows.flatMap((row) => expandOrders(row).map((h) => ({ h, row })));
  entries.sort((a, b) => a.h - b.h);
  const aggregates = used.aggregates.map((aggregate) => combineParts(aggregateParts(aggregate, used, env), env, env.windowCount));
  const rowParts = entries.map(({ h, row }) => orderParts(row, h, env));
  applyTimePohcAllowance(rowParts, aggregates, env);
  const rows = applyPohcAllowance(
    rowParts.map((parts) => combineParts(parts, env, env.windowCount)),
    aggregates,
    env,
  );
  const conditions = evaluateConditions(used, env.context);
  return {
    label: used.label,
    description: interpolated?.description,
    rows,
    aggregates,
    conditions,
    verdict: channelVerdict(rows, aggregates, conditions),
  };
}

/** Rows for the orders of candidate bands when no band could be chosen: measured only, not evaluated. */
function unchosenRows(candidates: Band[], reason: string, env: ChannelEnv): { rows: ComplianceRow[]; aggregates: ComplianceAggregate[] } {
  const byOrder = new Map<number, OrderRow>();
  for (const band of candidates) for (const row of band.orderRows) for (const h of expandOrders(row)) if (!byOrder.has(h)) byOrder.set(h, row);
  const rows = [...byOrder.entries()]
    .sort(([a], [b]) => a - b)
    .map(([h, row]): ComplianceRow => {
      const notMeasured = missingHarmonic(h, env);
      const measured = notMeasured ? null : toBasis((env.harmonics.get(h) as HarmonicValue).rms as number, row.basis, env);
      return {
        order: h,
        measured: measured?.ok ? measured.value : null,
        limit: null,
        unit: unitOf(row.basis),
        basis: row.basis,
        percentOfLimit: null,
        margin: null,
        verdict: "not-evaluated",
        reason: notMeasured ?? reason,
      };
    });
  const byName = new Map<string, AggregateRow>();
  for (const band of candidates) for (const aggregate of band.aggregates) if (!byName.has(aggregate.name)) byName.set(aggregate.name, aggregate);
  const aggregates = [...byName.values()].map((aggregate): ComplianceAggregate => {
    const { total, unavailable } = sumOrders(aggregate, (h) => (missingHarmonic(h, env) ? null : ((env.harmonics.get(h) as HarmonicValue).rms as number)));
    const measured = unavailable.length === 0 ? toBasis(total, aggregate.basis, env) : null;
    return {
      name: aggregate.name,
      measured: measured?.ok ? measured.value : null,
      limit: null,
      unit: unitOf(aggregate.basis),
      basis: aggregate.basis,
      percentOfLimit: null,
      margin: null,
      verdict: "not-evaluated",
      role: aggregate.role,
      reason,
    };
  });
  return { rows, aggregates };
}

const VERDICT_RANK: Record<OverallVerdict, number> = { pass: 0, incomplete: 1, fail: 2 };

function worstPercent(rows: ComplianceRow[], aggregates: ComplianceAggregate[]): number {
  const values = [...rows.map((row) => row.percentOfLimit), ...aggregates.map((aggregate) => aggregate.percentOfLimit)];
  return Math.max(-Infinity, ...values.filter((value): value is number => value !== null));
}

/** The time base and series of one channel for the revision's time rules; null when it has none. */
function channelTime(analysis: AnalysisResult, channel: ChannelResult, content: LimitSetRevisionContent, input: EvaluateComplianceInput): ChannelTime | null {
  const rules = content.rules.timeRules ?? [];
  if (rules.length === 0) return null;
  const cache = new Map<number, Float64Array | null>();
  const logged = input.timeSeries;
  if (logged) {
    const series = logged.channels[channel.name];
    const startsS = logged.startsS;
    const n = startsS.length;
    const durationS = n > 0 ? startsS[n - 1]! + logged.valueS - startsS[0]! : 0;
    return {
      rules,
      timing: n > 0 ? { source: "interval-log", valueS: logged.valueS, startsS, clockKnown: true, plans: {} } : null,
      unavailable: n > 0 ? undefined : `${logged.noun} has no rows`,
      snapshotFallback: false,
      orderSeries: (h) => series?.orders.get(h) ?? null,
      fundamental: series?.orders.get(1) ?? null,
      thdPercent: series?.thdPercent ?? null,
      basis: {
        source: "interval-log",
        valueS: logged.valueS,
        valueCount: n,
        durationS,
        startMs: n > 0 ? startsS[0]! * 1000 : null,
        snapshotFallback: false,
        coverage: "none",
      },
    };
  }
  const windowS = analysis.window.cycles / analysis.fundamentalHz;
  const series = channel.harmonicSeries;
  const count = series?.find((values) => values !== null)?.length ?? 0;
  const startMs = input.recordStartMs ?? null;
  const basis: TimeBasis = {
    source: series && count > 0 ? "windows" : "none",
    valueS: windowS,
    valueCount: count,
    durationS: count * windowS,
    startMs,
    snapshotFallback: true,
    coverage: "none",
  };
  if (!series || count === 0) {
    return {
      rules,
      timing: null,
      unavailable: "the analysis has no per-window order series (analyse with includeOrderSeries: true); the capture r.m.s. mean is compared instead",
      snapshotFallback: true,
      orderSeries: () => null,
      fundamental: null,
      thdPercent: null,
      basis,
    };
  }
  const offsetS = startMs === null ? 0 : startMs / 1000;
  const startsS = Float64Array.from({ length: count }, (_, k) => offsetS + k * windowS);
  const orderSeries = (h: number): Float64Array | null => {
    if (!cache.has(h)) {
      const values = series[h - 1];
      cache.set(h, values && values.length === count ? Float64Array.from(values) : null);
    }
    return cache.get(h) ?? null;
  };
  return {
    rules,
    timing: { source: "windows", valueS: windowS, startsS, clockKnown: startMs !== null, plans: {} },
    snapshotFallback: true,
    orderSeries,
    fundamental: orderSeries(1),
    thdPercent: null,
    basis,
  };
}

function channelEnv(
  analysis: AnalysisResult,
  channel: ChannelResult,
  content: LimitSetRevisionContent,
  context: EvaluationContext,
  input: EvaluateComplianceInput,
): ChannelEnv {
  const harmonics = new Map(channel.harmonics.map((harmonic) => [harmonic.order, harmonic]));
  const notes: string[] = [];
  const usesBasis = (basis: Basis): boolean =>
    content.bands.some((band) => band.orderRows.some((row) => row.basis === basis) || band.aggregates.some((aggregate) => aggregate.basis === basis));
  const usesLambda = content.bands.some((band) => band.orderRows.some((row) => row.formula?.includes("lambda")));

  let irefA = context.irefA;
  if (irefA === undefined && usesBasis("%Iref") && channel.rms > 0) {
    // IEC 61000-3-12: Iref is the measured average r.m.s. input current unless a value is declared.
    irefA = channel.rms;
    notes.push(`Iref = measured r.m.s. current ${fmt(channel.rms)} A (no irefA given; IEC 61000-3-12 Ed 2.0 definition of Iref)`);
  }
  let lambda = context.lambda;
  if (lambda === undefined && usesLambda) {
    const phase = analysis.power.phases.find((candidate) => candidate.current === channel.name);
    if (phase) {
      // IEC 61000-3-2: λ is the measured circuit power factor P / (U·I) (from memory).
      lambda = phase.truePowerFactor;
      notes.push(`λ = measured true power factor ${fmt(phase.truePowerFactor)} of ${phase.voltage} × ${phase.current} (no lambda given)`);
    }
  }
  const orders = channel.harmonics.map((harmonic) => harmonic.order);
  return {
    channel,
    harmonics,
    analysedUpTo: orders.length > 0 ? Math.max(...orders) : 0,
    maxResolvableOrder: analysis.maxResolvableOrder,
    content,
    context,
    lambda,
    irefA,
    notes,
    time: channelTime(analysis, channel, content, input),
    noun: input.timeSeries?.noun ?? "the analysis",
    windowCount: analysis.window.count,
  };
}

function evaluateChannel(
  analysis: AnalysisResult,
  channel: ChannelResult,
  content: LimitSetRevisionContent,
  context: EvaluationContext,
  input: EvaluateComplianceInput,
): ChannelCompliance & { timeBasis?: TimeBasis } {
  const env = channelEnv(analysis, channel, content, context, input);
  const timeBasis = env.time?.basis;
  const derived = { irefA: env.irefA, lambda: env.lambda, notes: env.notes };
  const selection = selectBand(content, context);
  const common = { channel: channel.name, phase: channel.phase, derived };
  const unchosenTimeRules = (reason: string): { timeRules?: TimeRuleSummary[]; timeBasis?: TimeBasis } =>
    env.time
      ? {
          timeRules: env.time.rules.map((rule) => ({
            rule: rule.id,
            label: rule.label,
            multiplier: rule.multiplier,
            status: "not-evaluated" as const,
            reason,
            valueCount: 0,
            periodCount: 0,
            failures: 0,
            ...(rule.source ? { source: rule.source } : {}),
          })),
          timeBasis,
        }
      : {};
  if (selection.status === "no-band") {
    return { ...common, band: { label: null, reason: selection.reason }, rows: [], aggregates: [], conditions: [], verdict: "incomplete", ...unchosenTimeRules(selection.reason) };
  }
  if (selection.status === "missing-context") {
    const { rows, aggregates } = unchosenRows(selection.candidates, `not evaluated: ${selection.reason}`, env);
    return { ...common, band: { label: null, reason: selection.reason }, rows, aggregates, conditions: [], verdict: "incomplete", ...unchosenTimeRules(selection.reason) };
  }
  const evaluations = selection.bands.map((band) => evaluateBand(band, env));
  // Alternatives: the first passing option wins; otherwise an incomplete one; all failing → fail.
  const chosen =
    evaluations.find((evaluation) => evaluation.verdict === "pass") ??
    evaluations.find((evaluation) => evaluation.verdict === "incomplete") ??
    (evaluations[0] as BandEvaluation);
  const reasonParts = [selection.reason, chosen.description];
  if (evaluations.length > 1) {
    reasonParts.push(`options: ${evaluations.map((evaluation) => `${evaluation.label} → ${evaluation.verdict}`).join("; ")}; shown: ${chosen.label}`);
  }
  if (chosen.rows.length === 0 && chosen.aggregates.length === 0 && chosen.verdict === "pass") reasonParts.push("no limits apply in this band");
  const band: BandChoice = {
    label: chosen.label,
    reason: reasonParts.filter(Boolean).join(" — "),
    ...(evaluations.length > 1 ? { options: evaluations.map((evaluation) => ({ label: evaluation.label, verdict: evaluation.verdict })) } : {}),
  };
  const timeRules = summarizeTimeRules(chosen.rows, chosen.aggregates, env);
  const timeExtras: { timeRules?: TimeRuleSummary[]; timeBasis?: TimeBasis } = {};
  if (timeRules && timeBasis) {
    const applied = timeRules.filter((rule) => rule.status === "applied").length;
    timeExtras.timeRules = timeRules;
    timeExtras.timeBasis = { ...timeBasis, coverage: applied === 0 ? "none" : applied === timeRules.length ? "all" : "partial" };
  }
  return { ...common, band, rows: chosen.rows, aggregates: chosen.aggregates, conditions: chosen.conditions, verdict: chosen.verdict, ...timeExtras };
}

/**
 * Judge an analysis against a limit-set revision: per-order rows, aggregates and a verdict for
 * every channel of the set's quantity (each phase), the worst channel shown at the top level.
 *
 * Measured values are expressed in each row's basis (A; % of I1, IL, Iref or Vnom; mA/W rows
 * compare amperes with mA/W × P capped by the absolute maximum). A value equal to its limit
 * passes when the set's `rules.comparison.passAtLimit` says so (every seed set: "≤ limit").
 * Missing context, orders above Nyquist and unverifiable conditions give `not-evaluated`
 * rows and an `incomplete` verdict, never a pass. Throws for an unknown `channel` or one whose
 * quantity does not match the set. O(channels × orders × rows).
 *
 * @example
 * const result = evaluateCompliance({
 *   analysis,
 *   limitSet: { key: "iec-61000-3-2-class-a", name: "IEC 61000-3-2 Class A", revision: { id: 1, number: 1 }, content },
 *   context: {},
 * });
 * result.rows.find((row) => row.order === 3) // { order: 3, measured: 2.5, limit: 2.3, unit: "A", verdict: "fail", … }
 */
export function evaluateCompliance(input: EvaluateComplianceInput): ComplianceResult {
  const content = LimitSetRevisionContentSchema.parse(input.limitSet.content);
  const context = EvaluationContextSchema.parse(input.context);
  const { analysis } = input;

  let channels = analysis.channels.filter((channel) => channel.quantity === content.quantity);
  if (input.channel !== undefined) {
    const named = analysis.channels.find((channel) => channel.name === input.channel);
    if (!named) {
      throw new Error(`channel "${input.channel}" not found; channels: ${analysis.channels.map((channel) => channel.name).join(", ")}`);
    }
    if (named.quantity !== content.quantity) {
      throw new Error(`channel "${input.channel}" is a ${named.quantity} channel but ${content.key} limits ${content.quantity}`);
    }
    channels = [named];
  }

  const notes: string[] = [];
  const { comparison, threshold, timeRules } = content.rules;
  // Sources and their provenance stay in the limit set (limit-table screens, JSON export); the sheet's notes say the rule in plain words.
  notes.push(comparison.passAtLimit ? "A value exactly at its limit passes (measured ≤ limit)." : "A value exactly at its limit fails (measured < limit passes).");
  if (threshold) {
    notes.push(`Currents below ${threshold.percentOfInputCurrent} % of the input current or below ${threshold.minimumA * 1000} mA, whichever is greater, are disregarded.`);
  }
  if (!timeRules || timeRules.length === 0) {
    notes.push(
      `measured values are the analysis's per-order r.m.s. values over ${analysis.window.count} window(s); this revision has no time rules (1.5 s smoothing, 150 % excursions, percentiles)`,
    );
  }

  const evaluated = channels.map((channel) => evaluateChannel(analysis, channel, content, context, input));
  const timeBasis = evaluated[0]?.timeBasis;
  const results: ChannelCompliance[] = evaluated.map(({ timeBasis: _basis, ...channel }) => channel);
  if (timeRules && timeRules.length > 0 && timeBasis) notes.push(timeRulesNote(timeRules, timeBasis, evaluated[0]?.timeRules));
  results.sort(
    (a, b) =>
      VERDICT_RANK[b.verdict] - VERDICT_RANK[a.verdict] || worstPercent(b.rows, b.aggregates) - worstPercent(a.rows, a.aggregates),
  );
  const worst = results[0];
  const limitSet = {
    key: input.limitSet.key,
    name: input.limitSet.name,
    standard: content.standard,
    edition: content.edition,
    scope: content.scope,
  };
  const timeFields = timeBasis ? { timeRules: worst?.timeRules, timeBasis } : {};
  if (!worst) {
    return {
      limitSet,
      revision: input.limitSet.revision,
      context,
      channel: null,
      band: { label: null, reason: `the analysis has no ${content.quantity} channel to evaluate` },
      rows: [],
      aggregates: [],
      conditions: [],
      verdict: "incomplete",
      channels: [],
      notes,
    };
  }
  return {
    limitSet,
    revision: input.limitSet.revision,
    context,
    channel: worst.channel,
    band: worst.band,
    rows: worst.rows,
    aggregates: worst.aggregates,
    conditions: worst.conditions,
    verdict: worst.verdict,
    channels: results,
    notes,
    ...timeFields,
  };
}

/** One note saying what the time rules were evaluated on and which were not. */
function timeRulesNote(rules: TimeRule[], basis: TimeBasis, summary: TimeRuleSummary[] | undefined): string {
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
