/**
 * Compare floats with a relative tolerance (default 1e-9), so a measurement exactly at a
 * limit computed by a formula (0.15·15/21) is judged "at the limit", not a hair above. A
 * non-finite value equals only itself.
 *
 * @example
 * approxEqual(0.1 + 0.2, 0.3) // true
 */
export function approxEqual(a: number, b: number, relativeTolerance = 1e-9): boolean {
  if (a === b) return true;
  // Infinity − x is Infinity, and Infinity ≤ tolerance × Infinity: without this an overflowed
  // value would count as "at the limit" of anything.
  if (!Number.isFinite(a) || !Number.isFinite(b)) return false;
  const scale = Math.max(Math.abs(a), Math.abs(b));
  return Math.abs(a - b) <= relativeTolerance * scale;
}
