// The capture-mean comparison: each order's and aggregate's r.m.s. value over the whole
// capture (or the analysis's single value per order) against its table limit. Time rules
// (apply-time-rules.ts) add their judgements on top of it.
import type { HarmonicValue } from "../analysis/types";
import { causeText, notEvaluatedText, partialSumText, thresholdText } from "../reports/result-wording";
import type { ChannelContext } from "./evaluation-types";
import { judge } from "./judge";
import { approxEqual } from "./approx-equal";
import type { AggregateRow, Band, OrderRow } from "./model";
import type { ComplianceAggregate, ComplianceRow, NotEvaluatedCause, ThresholdApplied } from "./result";
import { aggregateLimit, expandOrders, rowLimit, toBasis, unitOf } from "./row-limits";

function percentOf(measured: number | null, limit: number | null): number | null {
  if (measured === null || limit === null || limit <= 0) return null;
  return (measured / limit) * 100;
}

/** Measured against limit: % of limit and the headroom (limit − measured), null where either is unknown. */
export function comparison(measured: number | null, limit: number | null) {
  return {
    measured,
    limit,
    percentOfLimit: percentOf(measured, limit),
    margin: measured !== null && limit !== null ? limit - measured : null,
  };
}

/** Why order h has no measured value (null when it has one). */
export function missingHarmonic(h: number, ctx: ChannelContext): NotEvaluatedCause | null {
  const harmonic = ctx.harmonics.get(h);
  if (harmonic && harmonic.rms !== null) return null;
  // The causes name no order (the row does), so the sheet can list each distinct cause once.
  if (h > ctx.maxResolvableOrder || (harmonic && harmonic.rms === null)) return { code: "above-nyquist", maxResolvableOrder: ctx.maxResolvableOrder };
  if (ctx.record !== "analysis") return { code: "not-in-record", record: ctx.record };
  return { code: "not-analysed", analysedUpTo: ctx.analysedUpTo };
}

/** The capture-mean r.m.s. value of order h in the channel's unit (call after missingHarmonic). */
export function harmonicRms(h: number, ctx: ChannelContext): number {
  return (ctx.harmonics.get(h) as HarmonicValue).rms as number;
}

/** What a not-evaluated comparison shows: no measured value when it (or an input) is not finite, the limit only when finite. */
function nonFiniteComparison(cause: NotEvaluatedCause, measured: number | null, limit: number | null) {
  const shownMeasured = cause.code === "non-finite" && cause.quantity === "measured" ? null : measured;
  return { measured: shownMeasured, limit: limit !== null && Number.isFinite(limit) ? limit : null, percentOfLimit: null, margin: null };
}

/** A non-finite measured value (or an input it is computed from) or limit, as a cause; null when all are finite. */
function nonFiniteCause(measured: number | null, limit: number | null, inputs: number[]): NotEvaluatedCause | null {
  if ((measured !== null && !Number.isFinite(measured)) || inputs.some((x) => !Number.isFinite(x))) return { code: "non-finite", quantity: "measured" };
  if (limit !== null && !Number.isFinite(limit)) return { code: "non-finite", quantity: "limit" };
  return null;
}

function notEvaluatedRow<T extends ComplianceRow | ComplianceAggregate>(shown: Omit<T, "verdict">, cause: NotEvaluatedCause, note?: string): T {
  return { ...shown, verdict: "not-evaluated", reason: [notEvaluatedText(cause), note].filter(Boolean).join("; "), cause } as T;
}

/** One order's capture mean against its table limit (threshold rule included). */
export function captureMeanRow(row: OrderRow, h: number, ctx: ChannelContext): ComplianceRow {
  const unit = unitOf(row.basis);
  const base = { order: h, unit, basis: row.basis, limitSource: row.source };
  const limit = rowLimit(row, h, ctx);
  const limitValue = limit.ok ? limit.value : null;
  const notMeasured = missingHarmonic(h, ctx);
  if (notMeasured) {
    return { ...base, measured: null, limit: limitValue, percentOfLimit: null, margin: null, verdict: "not-evaluated", reason: causeText(notMeasured), cause: notMeasured };
  }
  const rms = harmonicRms(h, ctx);
  const measured = toBasis(rms, row.basis, ctx);
  const measuredValue = measured.ok ? measured.value : null;
  // An overflowed or corrupt value (Infinity, NaN) is never judged: it would pass or sit "at the limit".
  const nonFinite = nonFiniteCause(measuredValue, limitValue, [rms, ctx.channel.rms]);
  if (nonFinite) return notEvaluatedRow({ ...base, ...nonFiniteComparison(nonFinite, measuredValue, limitValue) }, nonFinite);
  const shown = { ...base, ...comparison(measuredValue, limitValue) };

  // IEC 61000-3-2: small currents are disregarded whatever their limit.
  const threshold = ctx.content.rules.threshold;
  if (threshold && ctx.channel.quantity === "current") {
    const fromInputA = (threshold.percentOfInputCurrent / 100) * ctx.channel.rms;
    const thresholdA = Math.max(fromInputA, threshold.minimumA);
    if (rms < thresholdA) {
      const applied: ThresholdApplied = {
        thresholdA,
        percentOfInputCurrent: threshold.percentOfInputCurrent,
        inputCurrentA: ctx.channel.rms,
        minimumA: threshold.minimumA,
        source: threshold.source,
      };
      return { ...shown, verdict: "below-threshold", reason: thresholdText(applied, rms), threshold: applied };
    }
  }
  if (!limit.ok) return notEvaluatedRow(shown, { code: "missing-input", input: limit.missing });
  if (!measured.ok) return notEvaluatedRow(shown, { code: "missing-input", input: measured.missing });
  const verdict = judge(measured.value, limit.value, ctx.content.rules.comparison.passAtLimit);
  const atLimit = approxEqual(measured.value, limit.value) ? "exactly at the limit: passes (measured ≤ limit)" : undefined;
  const reason = [limit.derivation, atLimit].filter(Boolean).join("; ");
  return { ...shown, verdict, ...(reason ? { reason } : {}) };
}

/** sqrt(Σ w_h·X_h²) over the aggregate's orders, with the orders that were unavailable. */
export function sumOrders(aggregate: AggregateRow, valueOf: (h: number) => number | null): { total: number; unavailable: number[] } {
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

function measuredOrders(aggregate: AggregateRow, ctx: ChannelContext) {
  return sumOrders(aggregate, (h) => (missingHarmonic(h, ctx) ? null : harmonicRms(h, ctx)));
}

/** "allowance condition only, …" for an aggregate that is not itself a requirement. */
function roleNoteOf(aggregate: AggregateRow): string | undefined {
  return aggregate.role === "allowance-condition" ? "allowance condition only, not itself a requirement" : undefined;
}

/**
 * What an aggregate's capture-mean reason says of its limit alone (how the limit was derived, the
 * aggregate's role), for a verdict a time rule decided: the capture mean's own remarks (e.g. its sum
 * missing orders) concern a value the verdict did not use. Undefined when there is nothing to say.
 */
export function aggregateLimitRemark(aggregate: AggregateRow, band: Band, ctx: ChannelContext): string | undefined {
  const limit = aggregateLimit(aggregate, band, ctx);
  return [limit.ok ? limit.derivation : undefined, roleNoteOf(aggregate)].filter(Boolean).join("; ") || undefined;
}

/** One aggregate's capture-mean value against its limit. */
export function captureMeanAggregate(aggregate: AggregateRow, band: Band, ctx: ChannelContext): ComplianceAggregate {
  const unit = unitOf(aggregate.basis);
  const base = { name: aggregate.name, unit, basis: aggregate.basis, role: aggregate.role, limitSource: aggregate.source };
  const limit = aggregateLimit(aggregate, band, ctx);
  const limitValue = limit.ok ? limit.value : null;
  const { total, unavailable } = measuredOrders(aggregate, ctx);
  const measured = toBasis(total, aggregate.basis, ctx);
  const measuredValue = measured.ok ? measured.value : null;
  const roleNote = roleNoteOf(aggregate);
  const nonFinite = nonFiniteCause(measuredValue, limitValue, [total]);
  if (nonFinite) return notEvaluatedRow({ ...base, ...nonFiniteComparison(nonFinite, measuredValue, limitValue) }, nonFinite, roleNote);
  const shown = { ...base, ...comparison(measuredValue, limitValue) };
  const withRole = (text: string): string => [text, roleNote].filter(Boolean).join("; ");
  if (!limit.ok) return notEvaluatedRow(shown, { code: "missing-input", input: limit.missing }, roleNote);
  if (!measured.ok) return notEvaluatedRow(shown, { code: "missing-input", input: measured.missing }, roleNote);
  const verdict = judge(measured.value, limit.value, ctx.content.rules.comparison.passAtLimit);
  // The aggregate's own note (with its provenance) stays in the limit-table screens.
  const detail = limit.derivation ?? "";
  if (unavailable.length > 0) {
    const cause: NotEvaluatedCause = { code: "partial-sum", unavailableOrders: unavailable, record: ctx.record };
    // A partial sum only grows with the missing orders: exceeding the limit already is a fail.
    if (verdict === "fail") return { ...shown, verdict: "fail", reason: withRole(partialSumText(unavailable, ctx.record, true)) };
    return { ...shown, verdict: "not-evaluated", reason: withRole(causeText(cause)), cause };
  }
  const reason = withRole(detail);
  return { ...shown, verdict, ...(reason ? { reason } : {}) };
}

/** Rows for the orders of candidate bands when no band could be chosen: measured only, not evaluated. */
export function unchosenRows(candidates: Band[], bandCause: NotEvaluatedCause, ctx: ChannelContext): { rows: ComplianceRow[]; aggregates: ComplianceAggregate[] } {
  const byOrder = new Map<number, OrderRow>();
  for (const band of candidates) for (const row of band.orderRows) for (const h of expandOrders(row)) if (!byOrder.has(h)) byOrder.set(h, row);
  const rows = [...byOrder.entries()]
    .sort(([a], [b]) => a - b)
    .map(([h, row]): ComplianceRow => {
      const notMeasured = missingHarmonic(h, ctx);
      const measured = notMeasured ? null : toBasis(harmonicRms(h, ctx), row.basis, ctx);
      return {
        order: h,
        measured: measured?.ok ? measured.value : null,
        limit: null,
        unit: unitOf(row.basis),
        basis: row.basis,
        percentOfLimit: null,
        margin: null,
        verdict: "not-evaluated",
        reason: notMeasured ? causeText(notMeasured) : notEvaluatedText(bandCause),
        cause: notMeasured ?? bandCause,
      };
    });
  const byName = new Map<string, AggregateRow>();
  for (const band of candidates) for (const aggregate of band.aggregates) if (!byName.has(aggregate.name)) byName.set(aggregate.name, aggregate);
  const aggregates = [...byName.values()].map((aggregate): ComplianceAggregate => {
    const { total, unavailable } = measuredOrders(aggregate, ctx);
    const measured = unavailable.length === 0 ? toBasis(total, aggregate.basis, ctx) : null;
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
      reason: notEvaluatedText(bandCause),
      cause: bandCause,
    };
  });
  return { rows, aggregates };
}
