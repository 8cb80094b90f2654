import { approxEqual } from "./approx-equal";

/**
 * Pass or fail of a measured value against a limit (same unit). A value equal to the limit
 * (within `approxEqual`) passes when `passAtLimit` ("measured ≤ limit"), else fails
 * ("measured < limit"). Callers make sure both are finite: `approxEqual(Infinity, x)` is not a
 * comparison. O(1).
 *
 * @example
 * judge(0.15, 0.15 * 15 / 15, true) // "pass"
 */
export function judge(measured: number, limit: number, passAtLimit: boolean): "pass" | "fail" {
  if (approxEqual(measured, limit)) return passAtLimit ? "pass" : "fail";
  return measured < limit ? "pass" : "fail";
}
