// Distortion indices from per-order r.m.s. values: THD, PWHD, TDD, THC, PWHC, K-factor, factor K.

/** Settings for {@link computeIndices}. */
export interface IndexParameters {
  /** Highest order that was evaluated (orders above are unknown, not zero). */
  resolvableOrder: number;
  /** Upper order of THD (40 or 50); capped at `resolvableOrder`. */
  thdMaxOrder: number;
  /** Maximum demand load current IL in A (TDD). */
  ilA?: number;
  /** Reference current Iref in A (THC, PWHC in %). */
  irefA?: number;
  /** BS 7821: e = eddy-current loss / I²R loss at the fundamental; q = exponent. */
  eddyLossRatio: number;
  exponent: number;
}

export interface Indices {
  thdPercent: number;
  thdMaxOrder: number;
  thd40Percent: number | null;
  thd50Percent: number | null;
  pwhdPercent: number | null;
  tddPercent?: number;
  thcA: number;
  pwhcA: number | null;
  thcPercentOfIref?: number;
  pwhcPercentOfIref?: number;
  kFactor: number;
  factorK: number;
  kMaxOrder: number;
}

function sumSquares(rms: ArrayLike<number>, from: number, to: number, weight: (h: number) => number = () => 1): number {
  let sum = 0;
  for (let h = from; h <= to; h++) sum += weight(h) * rms[h]! ** 2;
  return sum;
}

/**
 * Computes the distortion indices of one channel from its per-order r.m.s. values
 * (`rms[h]` = order h, h = 1 fundamental; index 0 unused).
 * - THD = √Σ_{h=2}^{H} I_h² / I_1 (IEC 61000-4-7 §3 / IEEE 519 §3 definition; H = 40 or 50)
 * - PWHD = √Σ_{h=14}^{40} h·I_h² / I_1 (IEC 61000-3-12)
 * - TDD = √Σ_{h=2}^{50} I_h² / IL (IEEE Std 519-2014 §3)
 * - THC = √Σ_{h=2}^{40} I_h², PWHC = √Σ_{h=14}^{40} h·I_h² (IEC 61000-3-12)
 * - K-factor = Σ h²·I_h² / Σ I_h², h = 1..50 (UL 1561 / IEEE C57.110 form)
 * - factor K = √(1 + e/(1+e)·(I_1/I)²·Σ_{h=2}^{50} h^q (I_h/I_1)²), I² = Σ I_h² (BS 7821)
 * Sums stop at `resolvableOrder`; PWHD/PWHC are null when order 40 is not resolvable.
 *
 * Complexity O(orders).
 *
 * @example
 * computeIndices([0, 1, 0, 0.2], { resolvableOrder: 3, thdMaxOrder: 40, eddyLossRatio: 0.1, exponent: 1.7 }).thdPercent // 20
 */
export function computeIndices(rms: ArrayLike<number>, p: IndexParameters): Indices {
  const top = Math.min(p.resolvableOrder, rms.length - 1);
  const i1 = rms[1]!;
  const thdTo = (order: number): number => (i1 > 0 ? (100 * Math.sqrt(sumSquares(rms, 2, Math.min(order, top)))) / i1 : 0);
  const thdMaxOrder = Math.min(p.thdMaxOrder, top);
  const to40 = Math.min(40, top);
  const to50 = Math.min(50, top);
  const pwhcA = top >= 40 ? Math.sqrt(sumSquares(rms, 14, 40, (h) => h)) : null;
  const total = sumSquares(rms, 1, to50);
  const result: Indices = {
    thdPercent: thdTo(thdMaxOrder),
    thdMaxOrder,
    thd40Percent: top >= 40 ? thdTo(40) : null,
    thd50Percent: top >= 50 ? thdTo(50) : null,
    pwhdPercent: pwhcA !== null && i1 > 0 ? (100 * pwhcA) / i1 : null,
    thcA: Math.sqrt(sumSquares(rms, 2, to40)),
    pwhcA,
    kFactor: total > 0 ? sumSquares(rms, 1, to50, (h) => h * h) / total : 1,
    factorK:
      total > 0 && i1 > 0
        ? Math.sqrt(1 + (p.eddyLossRatio / (1 + p.eddyLossRatio)) * ((i1 * i1) / total) * (sumSquares(rms, 2, to50, (h) => h ** p.exponent) / (i1 * i1)))
        : 1,
    kMaxOrder: to50,
  };
  if (p.ilA !== undefined) result.tddPercent = (100 * Math.sqrt(sumSquares(rms, 2, to50))) / p.ilA;
  if (p.irefA !== undefined) {
    result.thcPercentOfIref = (100 * result.thcA) / p.irefA;
    if (pwhcA !== null) result.pwhcPercentOfIref = (100 * pwhcA) / p.irefA;
  }
  return result;
}
