/**
 * The k-th smallest value (k = 0 is the minimum) by quickselect (Hoare partition,
 * median-of-three pivot). Rearranges `values` in place — pass a copy to keep the original.
 *
 * Why: percentile rules run over up to ~200 000 three-second values per order and week;
 * selection is O(n) on average where a full sort is O(n log n).
 *
 * Complexity O(n) average, O(n²) worst case. Throws for k outside 0..n−1.
 *
 * @example
 * orderStatistic(Float64Array.from([5, 1, 4, 2, 3]), 1) // 2
 */
export function orderStatistic(values: Float64Array, k: number): number {
  const n = values.length;
  if (!Number.isInteger(k) || k < 0 || k >= n) throw new Error(`orderStatistic requires 0 ≤ k < ${n}, got ${k}`);
  let lo = 0;
  let hi = n - 1;
  while (hi > lo) {
    const mid = (lo + hi) >>> 1;
    // Median of three as pivot, to avoid the quadratic case on sorted input.
    const a = values[lo]!;
    const b = values[mid]!;
    const c = values[hi]!;
    const pivot = a < b ? (b < c ? b : a < c ? c : a) : a < c ? a : b < c ? c : b;
    let i = lo;
    let j = hi;
    while (i <= j) {
      while (values[i]! < pivot) i++;
      while (values[j]! > pivot) j--;
      if (i <= j) {
        const t = values[i]!;
        values[i] = values[j]!;
        values[j] = t;
        i++;
        j--;
      }
    }
    if (k <= j) hi = j;
    else if (k >= i) lo = i;
    else return values[k]!;
  }
  return values[k]!;
}
