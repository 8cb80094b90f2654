import type { IntervalPlan } from "./plan-intervals";

/**
 * R.m.s. aggregation of values over the complete intervals of a plan: F = √( (1/n) Σ F_i² ),
 * the IEC 61000-4-30 aggregation rule (square root of the arithmetic mean of the squared
 * input values — from memory). 150/180-cycle (≈ 3 s) values are the r.m.s. of 15 consecutive
 * 10/12-cycle values; 10-minute values the r.m.s. of the 10/12-cycle values in the interval.
 *
 * Units: those of the values (A, V, % …). Complexity O(n).
 *
 * @example
 * const plan = planIntervals(4, { groupSize: 2, valueS: 0.2 });
 * aggregateIntervals([3, 4, 1, 1], plan) // Float64Array [3.5355…, 1]
 */
export function aggregateIntervals(values: ArrayLike<number>, plan: IntervalPlan): Float64Array {
  const out = new Float64Array(plan.starts.length);
  for (let i = 0; i < out.length; i++) {
    const first = plan.starts[i]!;
    const end = plan.ends[i]!;
    if (end > values.length) throw new Error("aggregateIntervals requires a plan made for this many values");
    let sumSquares = 0;
    for (let k = first; k < end; k++) sumSquares += values[k]! * values[k]!;
    out[i] = Math.sqrt(sumSquares / (end - first));
  }
  return out;
}
