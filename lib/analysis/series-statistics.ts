import { orderStatistic } from "./order-statistic";

/** Summary of one order's (or quantity's) values over a period. */
export interface SeriesStatistics {
  count: number;
  /** Arithmetic mean (IEC 61000-3-2: average of the 1.5 s smoothed values). */
  mean: number;
  /** √(mean of squares) (IEC 61000-4-30 aggregation rule). */
  rms: number;
  max: number;
  /** 95th and 99th percentiles, nearest-rank (see percentile). */
  p95: number;
  p99: number;
}

/**
 * Mean, r.m.s., maximum and nearest-rank 95th/99th percentiles of a series of values.
 *
 * Percentiles: the ⌈p/100 · n⌉-th smallest value (nearest rank), so p99 of 100 values is the
 * 99th smallest. Units: those of the values. Complexity O(n) average. Throws for an empty series.
 *
 * @example
 * seriesStatistics([1, 2, 3, 4]) // { count: 4, mean: 2.5, rms: 2.7386…, max: 4, p95: 4, p99: 4 }
 */
export function seriesStatistics(values: ArrayLike<number>): SeriesStatistics {
  const n = values.length;
  if (n < 1) throw new Error("seriesStatistics requires at least one value");
  let sum = 0;
  let sumSquares = 0;
  let max = -Infinity;
  const copy = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    const v = values[k]!;
    copy[k] = v;
    sum += v;
    sumSquares += v * v;
    if (v > max) max = v;
  }
  const rank = (p: number): number => Math.max(1, Math.ceil((p / 100) * n - 1e-9)) - 1;
  // Select the higher rank first: quickselect leaves everything below it on its left.
  const p99 = orderStatistic(copy, rank(99));
  const p95 = orderStatistic(copy.subarray(0, rank(99) + 1), rank(95));
  return { count: n, mean: sum / n, rms: Math.sqrt(sumSquares / n), max, p95, p99 };
}
