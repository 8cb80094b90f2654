import { complexSpectrum } from "./complex-spectrum";
import { MAX_ORDER, type FrontEndSpectrum } from "./types";

/**
 * Line-current spectrum of a 12- or 18-pulse converter built from identical six-pulse bridges on
 * transformer windings phase-shifted by 30° (12-pulse: 0°, 30°) or 20° (18-pulse: −20°, 0°, +20°).
 * A bridge on a winding lagging by δ draws harmonic h shifted by −hδ; referred back to the
 * primary a positive-sequence order (h = 6k+1) turns by +δ and a negative-sequence one (6k−1) by
 * −δ, so order h of bridge k carries e^(−j(h∓1)δ_k): orders 6k±1 with k odd cancel in a 12-pulse
 * set, all but 18k±1 in an 18-pulse set (Arrillaga & Watson, Power System Harmonics, 2nd ed.
 * 2003, §4.4 — from memory). Unequal sharing leaves a residual: the bridges carry currents in
 * proportion 1+ε, 1−ε (12) or 1+ε, 1, 1−ε (18), with ε = imbalance/2.
 *
 * @param sixPulse spectrum of one six-pulse bridge (orders 1–50)
 * @param pulses 12 or 18
 * @param imbalancePercent difference between the largest and smallest bridge current, % of their mean
 * @example multiPulseSpectrum(currentSourceBridgeSpectrum(0, 0), 12, 0).magnitude[5] // ≈ 0
 */
export function multiPulseSpectrum(sixPulse: FrontEndSpectrum, pulses: 12 | 18, imbalancePercent: number): FrontEndSpectrum {
  const eps = imbalancePercent / 200;
  const shifts = pulses === 12 ? [0, Math.PI / 6] : [-Math.PI / 9, 0, Math.PI / 9];
  const weights = pulses === 12 ? [1 + eps, 1 - eps] : [1 + eps, 1, 1 - eps];
  const re = new Float64Array(MAX_ORDER + 1);
  const im = new Float64Array(MAX_ORDER + 1);
  for (let h = 1; h <= MAX_ORDER; h++) {
    const m = sixPulse.magnitude[h]!;
    if (m === 0) continue;
    const ph = sixPulse.phaseRad[h]!;
    // Sequence of order h in a balanced set: h mod 3 = 1 positive, 2 negative, 0 zero (no shift back).
    const seq = h % 3 === 1 ? 1 : h % 3 === 2 ? -1 : 0;
    for (let k = 0; k < shifts.length; k++) {
      const d = shifts[k]!;
      const angle = ph - h * d + seq * d;
      re[h] = re[h]! + weights[k]! * m * Math.cos(angle);
      im[h] = im[h]! + weights[k]! * m * Math.sin(angle);
    }
  }
  return complexSpectrum(re, im);
}
