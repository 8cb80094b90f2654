// The pure compliance evaluator: analysis result + limit-set revision + context → per-order
// verdicts, aggregates and an overall verdict, with a reason wherever something is not a plain
// pass. Missing information never turns into a pass.
import type { AnalysisResult, ChannelResult, HarmonicValue } from "../analysis/types";
import { approxEqual } from "./approx-equal";
import { evaluateFormula } from "./evaluate-formula";
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

function expandOrders(row: { from: number; to: number; parity: OrderRow["parity"] }): number[] {
  const orders: number[] = [];
  for (let h = row.from; h <= row.to; h += 1) if (orderMatchesParity(h, row.parity)) orders.push(h);
  return orders;
}

function missingHarmonic(h: number, env: ChannelEnv): string | null {
  const harmonic = env.harmonics.get(h);
  if (harmonic && harmonic.rms !== null) return null;
  if (h > env.maxResolvableOrder || (harmonic && harmonic.rms === null)) {
    return `order ${h} is above Nyquist (highest resolvable order ${env.maxResolvableOrder})`;
  }
  return `order ${h} is not in the analysis (orders analysed up to ${env.analysedUpTo})`;
}

function evaluateRow(row: OrderRow, h: number, env: ChannelEnv): ComplianceRow {
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
  const shown = {
    ...base,
    measured: measuredValue,
    limit: limitValue,
    percentOfLimit: percentOf(measuredValue, limitValue),
    margin: measuredValue !== null && limitValue !== null ? limitValue - measuredValue : null,
  };

  // IEC 61000-3-2: small currents are disregarded whatever their limit.
  const threshold = env.content.rules.threshold;
  if (threshold && env.channel.quantity === "current") {
    const fromInputA = (threshold.percentOfInputCurrent / 100) * env.channel.rms;
    const thresholdA = Math.max(fromInputA, threshold.minimumA);
    if (rms < thresholdA) {
      return {
        ...shown,
        verdict: "below-threshold",
        reason: `${fmt(rms)} A < ${fmt(thresholdA)} A, the greater of ${threshold.percentOfInputCurrent} % of the input current ${fmt(env.channel.rms)} A (${fmt(fromInputA)} A) and ${fmt(threshold.minimumA)} A — disregarded (${threshold.source})`,
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

function evaluateAggregate(aggregate: AggregateRow, band: Band, env: ChannelEnv): ComplianceAggregate {
  const unit = unitOf(aggregate.basis);
  const base = { name: aggregate.name, unit, basis: aggregate.basis, role: aggregate.role, limitSource: aggregate.source };
  const limit = aggregateLimit(aggregate, band, env);
  const limitValue = limit.ok ? limit.value : null;
  const { total, unavailable } = sumOrders(aggregate, (h) => (missingHarmonic(h, env) ? null : ((env.harmonics.get(h) as HarmonicValue).rms as number)));
  const measured = toBasis(total, aggregate.basis, env);
  const measuredValue = measured.ok ? measured.value : null;
  const shown = {
    ...base,
    measured: measuredValue,
    limit: limitValue,
    percentOfLimit: percentOf(measuredValue, limitValue),
    margin: measuredValue !== null && limitValue !== null ? limitValue - measuredValue : null,
  };
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
    if (!inRange || row.verdict !== "fail" || row.measured === null || row.limit === null) return row;
    const withinFactor = judge(row.measured, row.limit * rule.factor, true) === "pass";
    if (!withinFactor) return row;
    const allowance = `exceeds the limit but is within ${rule.factor * 100} % of it`;
    if (pohc?.verdict === "pass") {
      return {
        ...row,
        verdict: "pass",
        reason: `${allowance} and ${rule.aggregate} ${fmt(pohc.measured as number)} A ≤ ${fmt(pohc.limit as number)} A: allowance applies (${rule.source})`,
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
  const aggregates = used.aggregates.map((aggregate) => evaluateAggregate(aggregate, used, env));
  const rows = applyPohcAllowance(
    entries.map(({ h, row }) => evaluateRow(row, h, env)),
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

function channelEnv(analysis: AnalysisResult, channel: ChannelResult, content: LimitSetRevisionContent, context: EvaluationContext): ChannelEnv {
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
  };
}

function evaluateChannel(analysis: AnalysisResult, channel: ChannelResult, content: LimitSetRevisionContent, context: EvaluationContext): ChannelCompliance {
  const env = channelEnv(analysis, channel, content, context);
  const derived = { irefA: env.irefA, lambda: env.lambda, notes: env.notes };
  const selection = selectBand(content, context);
  const common = { channel: channel.name, phase: channel.phase, derived };
  if (selection.status === "no-band") {
    return { ...common, band: { label: null, reason: selection.reason }, rows: [], aggregates: [], conditions: [], verdict: "incomplete" };
  }
  if (selection.status === "missing-context") {
    const { rows, aggregates } = unchosenRows(selection.candidates, `not evaluated: ${selection.reason}`, env);
    return { ...common, band: { label: null, reason: selection.reason }, rows, aggregates, conditions: [], verdict: "incomplete" };
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
  return { ...common, band, rows: chosen.rows, aggregates: chosen.aggregates, conditions: chosen.conditions, verdict: chosen.verdict };
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
  notes.push(`${comparison.passAtLimit ? "measured ≤ limit passes" : "measured < limit passes"} (${comparison.source})`);
  if (threshold) {
    notes.push(`currents below max(${threshold.percentOfInputCurrent} % of the input current, ${threshold.minimumA * 1000} mA) are disregarded (${threshold.source})`);
  }
  notes.push(
    `measured values are the analysis's per-order r.m.s. values over ${analysis.window.count} window(s); time rules (1.5 s smoothing, 150 % excursions, percentiles) are not applied${
      timeRules && timeRules.length > 0 ? " although this revision lists some" : ""
    }`,
  );

  const results = channels.map((channel) => evaluateChannel(analysis, channel, content, context));
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
  };
}
