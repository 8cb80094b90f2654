import { smoothingAlpha } from "./smoothing-alpha";

export interface SmoothFirstOrderOptions {
  /** Time constant τ in seconds; IEC 61000-4-7 uses 1.5 s (confirmed). */
  timeConstantS?: number;
  /**
   * Filter state before the first window. `first-value` (default): y_0 = x_1, so a steady input
   * gives a steady output from the start — Ordwise's choice, because a zero start biases the
   * observation-period average low (a false pass) during the first few seconds. `zero`: the
   * filter starts from rest (the textbook step response).
   */
  initial?: "first-value" | "zero";
}

/**
 * The IEC 61000-4-7 1.5 s first-order low-pass ("smoothing") filter applied to a series of
 * per-window r.m.s. values (10/12-cycle windows).
 *
 * Discrete form: y_k = (1/α)·x_k + (β/α)·y_{k−1}. For 200 ms windows the standard gives
 * α = 8.012, β = 7.012 (IEC 61000-4-7, smoothing filter — from memory); here α is derived from
 * the actual window duration, α = 1 / (1 − e^(−T/1.5 s)), β = α − 1 (see smoothingAlpha), so
 * a unit step from rest gives exactly y_k = 1 − e^(−k·T/τ).
 *
 * Units: output in the unit of the input (A or V). Complexity O(n). Throws for an empty series.
 *
 * @example
 * smoothFirstOrder([1, 1, 1], 0.2, { initial: "zero" }) // [0.1248…, 0.2343…, 0.3300…]
 */
export function smoothFirstOrder(values: ArrayLike<number>, windowS: number, options: SmoothFirstOrderOptions = {}): Float64Array {
  if (values.length < 1) throw new Error("smoothFirstOrder requires at least one value");
  const { alpha, beta } = smoothingAlpha(windowS, options.timeConstantS ?? 1.5);
  const gain = 1 / alpha;
  const keep = beta / alpha;
  const out = new Float64Array(values.length);
  let y = options.initial === "zero" ? 0 : values[0]!;
  for (let k = 0; k < values.length; k++) {
    y = gain * values[k]! + keep * y;
    out[k] = y;
  }
  return out;
}
