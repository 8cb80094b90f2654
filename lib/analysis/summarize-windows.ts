// Whole-capture statistics of a per-window series.
import { percentile } from "./percentile";

/** Statistics of one quantity over the windows of a capture. */
export interface WindowSummary {
  /** √(mean of squares): the IEC 61000-4-30 aggregation rule for r.m.s. quantities. */
  rmsMean: number;
  max: number;
  /** 95th percentile, nearest rank (see percentile): the value not exceeded in 95 % of windows. */
  p95: number;
}

/**
 * Summarises per-window values taken with `stride` from `values` starting at `offset`
 * (so one flat array can hold every order of every window).
 *
 * Complexity O(n) on average (the percentile is a selection, not a sort).
 *
 * @example
 * summarizeWindows(Float64Array.from([1, 2, 3, 4]), 0, 1, 4) // { rmsMean: 2.7386…, max: 4, p95: 4 }
 */
export function summarizeWindows(values: ArrayLike<number>, offset: number, stride: number, count: number): WindowSummary {
  if (count < 1) throw new Error("summarizeWindows requires at least one window");
  const series = new Float64Array(count);
  let sumSquares = 0;
  let max = -Infinity;
  for (let w = 0; w < count; w++) {
    const v = values[offset + w * stride]!;
    series[w] = v;
    sumSquares += v * v;
    if (v > max) max = v;
  }
  return { rmsMean: Math.sqrt(sumSquares / count), max, p95: percentile(series, 95) };
}
