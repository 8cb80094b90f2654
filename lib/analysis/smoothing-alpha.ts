/**
 * The coefficients α and β of the IEC 61000-4-7 first-order smoothing filter for windows of
 * `windowS` seconds: y_k = (1/α)·x_k + (β/α)·y_{k−1}, with β = α − 1.
 *
 * Why derive α: the standard's α = 8.012, β = 7.012 (IEC 61000-4-7 smoothing filter, time
 * constant 1.5 s — the 8.012/7.012 figures from memory) are for exactly 200 ms windows. A
 * 10-cycle window of a measured 49.9 Hz fundamental lasts 200.4 ms, so α is derived from the
 * actual window length as α = 1 / (1 − e^(−T/τ)) (the exact discretisation of the
 * continuous-time step response 1 − e^(−t/τ)); T = 0.2 s, τ = 1.5 s gives α = 8.0111.
 *
 * Complexity O(1). Throws for a non-positive window or time constant.
 *
 * @example
 * smoothingAlpha(0.2) // { alpha: 8.0111…, beta: 7.0111… }
 */
export function smoothingAlpha(windowS: number, timeConstantS = 1.5): { alpha: number; beta: number } {
  if (!(windowS > 0) || !Number.isFinite(windowS)) throw new Error("smoothingAlpha requires a positive window duration");
  if (!(timeConstantS > 0) || !Number.isFinite(timeConstantS)) throw new Error("smoothingAlpha requires a positive time constant");
  const alpha = 1 / (1 - Math.exp(-windowS / timeConstantS));
  return { alpha, beta: alpha - 1 };
}
