// Limit formulas checked when a revision is saved: every value they give for the orders they
// cover must be a usable limit. Structural input types keep this file free of model.ts (which
// calls it), so there is no import cycle.
import { formatNumber } from "./format-number";
import { orderMatchesParity, type Parity } from "./order-matches-parity";
import { FormulaSyntaxError, parseFormula, type FormulaVariables } from "./parse-formula";

interface RangeLike {
  min?: number;
  max?: number;
}
interface ContentLike {
  bands: Array<{
    applicability?: { ratedPowerW?: RangeLike };
    orderRows: Array<{ from: number; to: number; parity: Parity; formula?: string; capFormulaA?: string }>;
    aggregates: Array<{ formula?: string }>;
  }>;
}

/** One refused formula value: where (a path into the content) and why. */
export interface FormulaValueIssue {
  path: Array<string | number>;
  message: string;
}

// λ is a power factor in 0..1; 0.05 stands for "small" without dividing by zero where the
// formula is meant for real circuits (common practice, no source).
const LAMBDA_SAMPLES = [0.05, 0.5, 1];

function powerSamples(range: RangeLike | undefined): number[] {
  const samples = [range?.min, range?.max].filter((p): p is number => p !== undefined && Number.isFinite(p) && p > 0);
  return samples.length > 0 ? samples : [1, 100_000];
}

/** The first bad value of a formula over the sample points, or null. */
function firstBadValue(formula: string, points: FormulaVariables[]): { at: FormulaVariables; value: number } | null {
  let compiled;
  try {
    compiled = parseFormula(formula);
  } catch (error) {
    if (error instanceof FormulaSyntaxError) return null; // reported by the formula's own schema
    throw error;
  }
  for (const at of points) {
    const value = compiled.evaluate(at);
    if (!Number.isFinite(value) || value < 0) return { at, value };
  }
  return null;
}

function describePoint(at: FormulaVariables, uses: { P: boolean; lambda: boolean }): string {
  const parts = at.h !== undefined ? [`order ${at.h}`] : [];
  if (uses.P && at.P !== undefined) parts.push(`P = ${formatNumber(at.P)} W`);
  if (uses.lambda && at.lambda !== undefined) parts.push(`λ = ${at.lambda}`);
  return parts.join(", ");
}

function samplePoints(orders: Array<number | undefined>, formula: string, powers: number[]): { points: FormulaVariables[]; uses: { P: boolean; lambda: boolean } } {
  let variables: readonly string[] = [];
  try {
    variables = parseFormula(formula).variables;
  } catch {
    return { points: [], uses: { P: false, lambda: false } };
  }
  const uses = { P: variables.includes("P"), lambda: variables.includes("lambda") };
  const points: FormulaVariables[] = [];
  for (const h of orders) {
    for (const P of uses.P ? powers : [undefined]) {
      for (const lambda of uses.lambda ? LAMBDA_SAMPLES : [undefined]) {
        points.push({ ...(h !== undefined ? { h } : {}), ...(P !== undefined ? { P } : {}), ...(lambda !== undefined ? { lambda } : {}) });
      }
    }
  }
  return { points, uses };
}

/**
 * Evaluate every limit formula of a revision for each order it covers (and, where it uses P or
 * λ, at the band's rated-power bounds and λ = 0.05, 0.5, 1): each value must be a finite
 * number ≥ 0. Returns one issue per formula naming the order and the value, e.g.
 * `order 5: formula "1/(h-5)" gives Infinity; a limit must be a finite number ≥ 0`.
 * O(orders × samples × formula length).
 *
 * @example
 * formulaValueIssues({ bands: [{ orderRows: [{ from: 2, to: 2, parity: "all", formula: "-1" }], aggregates: [] }] })
 * // [{ path: ["bands", 0, "orderRows", 0, "formula"], message: 'order 2: formula "-1" gives -1; a limit must be a finite number ≥ 0' }]
 */
export function formulaValueIssues(content: ContentLike): FormulaValueIssue[] {
  const issues: FormulaValueIssue[] = [];
  content.bands.forEach((band, bandIndex) => {
    const powers = powerSamples(band.applicability?.ratedPowerW);
    const check = (formula: string | undefined, orders: Array<number | undefined>, path: Array<string | number>): void => {
      if (formula === undefined) return;
      const { points, uses } = samplePoints(orders, formula, powers);
      const bad = firstBadValue(formula, points);
      if (!bad) return;
      const where = describePoint(bad.at, uses);
      issues.push({ path, message: `${where ? `${where}: ` : ""}formula "${formula}" gives ${String(bad.value)}; a limit must be a finite number ≥ 0` });
    };
    band.orderRows.forEach((row, rowIndex) => {
      const orders: number[] = [];
      for (let h = row.from; h <= row.to; h += 1) if (orderMatchesParity(h, row.parity)) orders.push(h);
      check(row.formula, orders, ["bands", bandIndex, "orderRows", rowIndex, "formula"]);
      check(row.capFormulaA, orders, ["bands", bandIndex, "orderRows", rowIndex, "capFormulaA"]);
    });
    band.aggregates.forEach((aggregate, aggregateIndex) => {
      check(aggregate.formula, [undefined], ["bands", bandIndex, "aggregates", aggregateIndex, "formula"]);
    });
  });
  return issues;
}
