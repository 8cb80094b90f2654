/**
 * Compare floats with a relative tolerance (default 1e-9), so a measurement exactly at a
 * limit computed by a formula (0.15·15/21) is judged "at the limit", not a hair above.
 *
 * @example
 * approxEqual(0.1 + 0.2, 0.3) // true
 */
export function approxEqual(a: number, b: number, relativeTolerance = 1e-9): boolean {
  if (a === b) return true;
  const scale = Math.max(Math.abs(a), Math.abs(b));
  return Math.abs(a - b) <= relativeTolerance * scale;
}
