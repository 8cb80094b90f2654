// Limits of order rows and aggregates in the row's unit, and measured values converted to a
// row's basis (A; % of I1, V1, IL, Iref or Vnom).
import { describeOrders } from "../reports/result-wording";
import { evaluateFormula } from "./evaluate-formula";
import type { ChannelContext, Derived } from "./evaluation-types";
import { formatNumber as fmt } from "./format-number";
import type { AggregateRow, Band, Basis, OrderRow } from "./model";
import { orderMatchesParity } from "./order-matches-parity";
import { FormulaVariableError, type FormulaVariable } from "./parse-formula";
import type { ContextInput } from "./result";

/** The context input a formula variable stands for. */
const VARIABLE_INPUT: Record<FormulaVariable, ContextInput> = { h: "h", P: "ratedPowerW", lambda: "lambda" };

/** Unit of a row's measured value and limit: mA/W rows are compared in amperes. */
export function unitOf(basis: Basis): string {
  return basis === "mA/W" ? "A" : basis;
}

/** The orders of a from..to row of a parity class. */
export function expandOrders(row: { from: number; to: number; parity: OrderRow["parity"] }): number[] {
  const orders: number[] = [];
  for (let h = row.from; h <= row.to; h += 1) if (orderMatchesParity(h, row.parity)) orders.push(h);
  return orders;
}


/** Convert a value in the channel's unit (A or V) to the basis's unit. */
export function toBasis(value: number, basis: Basis, ctx: ChannelContext): Derived<number> {
  switch (basis) {
    case "A":
    case "mA/W":
      return { ok: true, value };
    case "%I1":
    case "%V1":
      return ctx.channel.fundamentalRms > 0
        ? { ok: true, value: (value / ctx.channel.fundamentalRms) * 100 }
        : { ok: false, missing: "fundamental" };
    case "%IL":
      return ctx.context.ilA !== undefined
        ? { ok: true, value: (value / ctx.context.ilA) * 100 }
        : { ok: false, missing: "ilA" };
    case "%Iref":
      return ctx.irefA !== undefined && ctx.irefA > 0
        ? { ok: true, value: (value / ctx.irefA) * 100 }
        : { ok: false, missing: "irefA" };
    case "%Vnom":
      return ctx.context.nominalVoltageV !== undefined
        ? { ok: true, value: (value / ctx.context.nominalVoltageV) * 100 }
        : { ok: false, missing: "nominalVoltageV" };
  }
}

function evaluateValue(limit: number | undefined, formula: string | undefined, variables: Record<string, number | undefined>): Derived<number> {
  try {
    return { ok: true, value: limit ?? evaluateFormula(formula as string, variables) };
  } catch (error) {
    if (error instanceof FormulaVariableError) return { ok: false, missing: VARIABLE_INPUT[error.variable] };
    throw error;
  }
}

/** The limit of one order in the unit of the row (amperes for mA/W rows), with how it was obtained. */
export function rowLimit(row: OrderRow, h: number, ctx: ChannelContext): Derived<number> {
  const P = ctx.context.ratedPowerW;
  const base = evaluateValue(row.limit, row.formula, { h, P, lambda: ctx.lambda });
  if (!base.ok) return base;
  let value = base.value;
  const parts: string[] = [];
  if (row.formula !== undefined) parts.push(`${row.formula} at h = ${h}${row.formula.includes("lambda") && ctx.lambda !== undefined ? `, λ = ${fmt(ctx.lambda)}` : ""}`);
  if (row.basis === "mA/W") {
    if (P === undefined) return { ok: false, missing: "ratedPowerW" };
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
  // A row's own note (with its provenance) stays in the limit-table screens; the set's notes give its reading once.
  return { ok: true, value, derivation: parts.length > 0 ? parts.join("; ") : undefined };
}

/** The limit of an aggregate (THD, TDD, PWHC, POHC, …) in its unit, with how it was obtained. */
export function aggregateLimit(aggregate: AggregateRow, band: Band, ctx: ChannelContext): Derived<number> {
  if (aggregate.fromOrderLimits) {
    // Same sum as the measured quantity, applied to the per-order limits in amperes.
    let sum = 0;
    for (const h of expandOrders(aggregate)) {
      const row = band.orderRows.find((candidate) => candidate.from <= h && h <= candidate.to && orderMatchesParity(h, candidate.parity));
      if (!row) continue;
      if (row.basis !== "A" && row.basis !== "mA/W") return { ok: false, missing: "ampere-order-limits" };
      const limit = rowLimit(row, h, ctx);
      if (!limit.ok) return limit;
      sum += (aggregate.weighting === "order" ? h : 1) * limit.value * limit.value;
    }
    const value = Math.sqrt(sum);
    return { ok: true, value, derivation: `limit = ${aggregate.name} of the order limits ${describeOrders(expandOrders(aggregate))} = ${fmt(value)} A` };
  }
  const base = evaluateValue(aggregate.limit, aggregate.formula, { P: ctx.context.ratedPowerW, lambda: ctx.lambda });
  if (!base.ok || aggregate.basis !== "mA/W") return base;
  const P = ctx.context.ratedPowerW;
  if (P === undefined) return { ok: false, missing: "ratedPowerW" };
  const value = (base.value * P) / 1000;
  return { ok: true, value, derivation: `${fmt(base.value)} mA/W × ${P} W = ${fmt(value)} A` };
}
