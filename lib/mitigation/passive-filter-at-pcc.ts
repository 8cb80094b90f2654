import type { CapacitorDuty } from "./types";

/** Source X/R when none is given (a common planning value for LV/MV supplies; common practice, no source). */
export const DEFAULT_X_OVER_R = 10;

/**
 * Capacitor duty limits, % of rating: r.m.s. voltage 110, peak voltage 120 (of √2 × rated r.m.s.),
 * r.m.s. current 180, reactive power 135 (IEEE Std 18-2012, §5.1 continuous overload limits —
 * from memory; the 2002 edition had 135 % for current).
 */
export const CAPACITOR_LIMITS = { rmsVoltagePercent: 110, peakVoltagePercent: 120, rmsCurrentPercent: 180, kvarPercent: 135 } as const;

export interface PassiveFilterInput {
  /** Tuning order h_t (e.g. 4.7). */
  tuningOrder: number;
  /** Three-phase reactive power of the capacitor bank at the bus voltage, kvar (its rating). */
  kvar: number;
  /** Quality factor of the reactor: R = X_L·h_t/q. */
  q: number;
  /** Line-to-line bus voltage, V. */
  busVoltageV: number;
  /** Short-circuit current at the PCC, A. */
  iscA: number;
  xOverR: number;
}

export interface PassiveFilterResult {
  /** Per order h (index = order): fraction of the load's harmonic current that flows into the supply, |Z_F/(Z_F+Z_S)|. */
  supplyShare: (order: number) => number;
  /** Per order: fraction that flows into the filter, |Z_S/(Z_F+Z_S)|. */
  filterShare: (order: number) => number;
  /** Parallel resonance of source and filter, h_p = √(X_C/(X_L + X_S)). */
  parallelResonanceOrder: number;
  /** Ohms per phase (wye equivalent) at the fundamental. */
  xcOhm: number;
  xlOhm: number;
  rOhm: number;
  xsOhm: number;
  rsOhm: number;
  /** Capacitor duty for load harmonic currents (A per order, index = order). */
  capacitorDuty: (loadHarmonicsA: ReadonlyMap<number, number>) => CapacitorDuty;
}

/**
 * A passive single-tuned shunt filter at the PCC (per phase, wye equivalent):
 * X_C = V_LL²/Q_C, X_L = X_C/h_t², R = X_L·h_t/q, Z_F(h) = R + j(h·X_L − X_C/h);
 * source X_S = V_LL/(√3·I_sc), R_S = X_S/(X/R), Z_S(h) = R_S + j·h·X_S. The load's harmonic current
 * divides between them: I_S(h) = I_h·Z_F/(Z_F + Z_S) (current divider; IEEE Std 1531-2020 and
 * Arrillaga & Watson, Power System Harmonics 2nd ed. §8 — from memory). The source's resistance is
 * taken constant with frequency (skin effect ignored).
 *
 * @example passiveFilterAtPcc({ tuningOrder: 4.7, kvar: 300, q: 30, busVoltageV: 480, iscA: 30000, xOverR: 10 }).parallelResonanceOrder
 */
export function passiveFilterAtPcc(input: PassiveFilterInput): PassiveFilterResult {
  const { tuningOrder: ht, kvar, q, busVoltageV: vll, iscA, xOverR } = input;
  const xc = (vll * vll) / (kvar * 1000);
  const xl = xc / (ht * ht);
  const r = (xl * ht) / q;
  const xs = vll / (Math.sqrt(3) * iscA);
  const rs = xs / xOverR;
  const parts = (h: number) => {
    const zfR = r;
    const zfI = h * xl - xc / h;
    const zsR = rs;
    const zsI = h * xs;
    const sum = Math.hypot(zfR + zsR, zfI + zsI);
    return { zf: Math.hypot(zfR, zfI), zs: Math.hypot(zsR, zsI), sum, zfI };
  };
  const supplyShare = (h: number): number => {
    const p = parts(h);
    return p.zf / p.sum;
  };
  const filterShare = (h: number): number => {
    const p = parts(h);
    return p.zs / p.sum;
  };
  const capacitorDuty = (loadHarmonicsA: ReadonlyMap<number, number>): CapacitorDuty => {
    const vph = vll / Math.sqrt(3);
    // Fundamental: the bus voltage across the series L–C raises the capacitor's voltage by
    // X_C/(X_C − X_L) = h_t²/(h_t² − 1).
    const i1 = vph / (xc - xl);
    const vc1 = i1 * xc;
    let vSq = vc1 * vc1;
    let vPeak = vc1;
    let iSq = i1 * i1;
    let varSum = vc1 * i1;
    for (const [h, ih] of loadHarmonicsA) {
      if (h < 2) continue;
      const ifh = ih * filterShare(h);
      const vch = (ifh * xc) / h;
      vSq += vch * vch;
      vPeak += vch;
      iSq += ifh * ifh;
      varSum += vch * ifh;
    }
    const ratedI = (kvar * 1000) / (Math.sqrt(3) * vll);
    const ratedVarPerPhase = (kvar * 1000) / 3;
    const duty = {
      rmsVoltagePercent: (100 * Math.sqrt(vSq)) / vph,
      // Peak: arithmetic sum of the orders' peaks, the worst case IEEE 18 asks for.
      peakVoltagePercent: (100 * vPeak) / vph,
      rmsCurrentPercent: (100 * Math.sqrt(iSq)) / ratedI,
      kvarPercent: (100 * varSum) / ratedVarPerPhase,
    };
    const withinLimits =
      duty.rmsVoltagePercent <= CAPACITOR_LIMITS.rmsVoltagePercent &&
      duty.peakVoltagePercent <= CAPACITOR_LIMITS.peakVoltagePercent &&
      duty.rmsCurrentPercent <= CAPACITOR_LIMITS.rmsCurrentPercent &&
      duty.kvarPercent <= CAPACITOR_LIMITS.kvarPercent;
    return { ...duty, limits: { ...CAPACITOR_LIMITS }, withinLimits };
  };
  return { supplyShare, filterShare, parallelResonanceOrder: Math.sqrt(xc / (xl + xs)), xcOhm: xc, xlOhm: xl, rOhm: r, xsOhm: xs, rsOhm: rs, capacitorDuty };
}
