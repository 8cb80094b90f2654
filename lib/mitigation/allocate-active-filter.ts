/**
 * An active harmonic filter of r.m.s. rating A cancels the selected orders largest first: each
 * order is cancelled whole while the r.s.s. of what it injects stays within the rating
 * (I_AF = √Σ I_h²); the first order that does not fit is cancelled in part with what is left,
 * and the rest stay. (Largest-first is common practice, no source.)
 *
 * @param harmonicsA load harmonic currents by order, A
 * @param ratingA filter rating, A r.m.s.
 * @returns residual per order (A) and the rating used (A)
 * @example allocateActiveFilter(new Map([[5, 40], [7, 30], [11, 20]]), 45) // 5th → 0, 7th → 30 − √(45² − 40²) = 9.38
 */
export function allocateActiveFilter(
  harmonicsA: ReadonlyMap<number, number>,
  ratingA: number,
  orders: { from: number; to: number } = { from: 2, to: 50 },
): { residualA: Map<number, number>; ratingUsedA: number } {
  const residualA = new Map(harmonicsA);
  const selected = [...harmonicsA.entries()].filter(([h, a]) => h >= orders.from && h <= orders.to && a > 0).sort((a, b) => b[1] - a[1] || a[0] - b[0]);
  let left = ratingA * ratingA;
  let used = 0;
  for (const [h, a] of selected) {
    if (left <= 0) break;
    if (a * a <= left) {
      residualA.set(h, 0);
      left -= a * a;
      used += a * a;
    } else {
      const injected = Math.sqrt(left);
      residualA.set(h, a - injected);
      used += left;
      left = 0;
    }
  }
  return { residualA, ratingUsedA: Math.sqrt(used) };
}
