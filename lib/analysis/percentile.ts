import { orderStatistic } from "./order-statistic";

/**
 * The p-th percentile of `values` by the **nearest-rank** definition: the smallest value such
 * that at least p % of the values are ≤ it, i.e. the ⌈p/100 · n⌉-th smallest (1-based).
 *
 * Why nearest-rank: it is always one of the measured values (no interpolation between two
 * 10-minute values), and "not exceeded for p % of the values" matches IEEE Std 519-2014's wording
 * "value exceeded for (100 − p) % of the measurement period" (IEEE 519 clause 3 definitions,
 * confirmed) — the same definition as the whole-capture p95 of the analysis engine.
 * p = 0 gives the minimum, p = 100 the maximum.
 *
 * Units: those of the values. Complexity O(n) average (selection on a copy). Throws for an
 * empty input or p outside 0..100.
 *
 * @example
 * percentile([15, 20, 35, 40, 50], 40) // 20   (⌈0.4 · 5⌉ = 2nd smallest)
 * percentile([1, 2, 3, 4, 5, 6, 7, 8, 9, 10], 95) // 10
 */
export function percentile(values: ArrayLike<number>, p: number): number {
  if (values.length < 1) throw new Error("percentile requires at least one value");
  if (!(p >= 0 && p <= 100)) throw new Error(`percentile requires 0 ≤ p ≤ 100, got ${p}`);
  const n = values.length;
  const rank = Math.max(1, Math.ceil((p / 100) * n - 1e-9));
  return orderStatistic(Float64Array.from(values), rank - 1);
}
