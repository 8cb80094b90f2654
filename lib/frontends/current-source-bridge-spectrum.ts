import { complexSpectrum } from "./complex-spectrum";
import { MAX_ORDER, type FrontEndSpectrum } from "./types";

/** Overlap angle μ (radians) of a six-pulse bridge, or null when the bridge cannot commutate. */
export function overlapAngleRad(firingAngleRad: number, commutationReactancePercent: number): number | null {
  // cos α − cos(α + μ) = 2ωL_s·I_d / (√2·V_LL) (Mohan, Undeland, Robbins, Power Electronics,
  // 3rd ed. 2003, §5-6 / §6-3-3). With X% = 100·ωL_s·I_1/(V_LL/√3) and I_1 = (√6/π)·I_d
  // (Mohan §5-6-1) the right side is (π/3)·X/100.
  const rhs = (Math.PI / 3) * (commutationReactancePercent / 100);
  const c = Math.cos(firingAngleRad) - rhs;
  if (c < -1) return null;
  return Math.acos(c) - firingAngleRad;
}

/** ∫_a^b e^(−jmθ) dθ as [re, im]. */
function expIntegral(m: number, a: number, b: number): [number, number] {
  if (m === 0) return [b - a, 0];
  // (e^(−jmb) − e^(−jma)) / (−jm) = j(e^(−jmb) − e^(−jma))/m
  const dr = Math.cos(m * b) - Math.cos(m * a);
  const di = -Math.sin(m * b) + Math.sin(m * a);
  return [-di / m, dr / m];
}

/** ∫_a^b cos(θ + φ)·e^(−jhθ) dθ as [re, im]. */
function cosIntegral(h: number, phi: number, a: number, b: number): [number, number] {
  const [r1, i1] = expIntegral(h - 1, a, b);
  const [r2, i2] = expIntegral(h + 1, a, b);
  const c = Math.cos(phi);
  const s = Math.sin(phi);
  // ½[e^(jφ)·E(h−1) + e^(−jφ)·E(h+1)]
  return [0.5 * (c * r1 - s * i1 + c * r2 + s * i2), 0.5 * (s * r1 + c * i1 - s * r2 + c * i2)];
}

/**
 * Line-current spectrum of a six-pulse bridge feeding a smooth DC current (current-source
 * rectifier), with firing angle α and commutation overlap from the supply/commutation reactance.
 * Closed form: the Fourier integrals of the phase-a current, whose edges during overlap follow
 * i = I_s·(cos α − cos x) (Mohan et al., Power Electronics, 3rd ed. 2003, §5-6-2 / §6-3-3).
 * Supply voltage e_a = cos θ; phase a conducts from θ = −60° + α. α = 0 is a diode bridge.
 *
 * @param firingAngleDeg α in degrees (0 for diodes), 0–90
 * @param commutationReactancePercent X% = 100·ωL_s·I_1/(V_LL/√3), ≥ 0
 * @returns orders 1–50; even and triplen orders are zero
 * @example currentSourceBridgeSpectrum(0, 0).magnitude[5] // 0.2 (= 1/5)
 */
export function currentSourceBridgeSpectrum(firingAngleDeg: number, commutationReactancePercent: number): FrontEndSpectrum {
  const alpha = (firingAngleDeg * Math.PI) / 180;
  let mu = overlapAngleRad(alpha, commutationReactancePercent);
  if (mu === null) throw new Error(`the bridge cannot commutate at α = ${firingAngleDeg}° with ${commutationReactancePercent} % reactance`);
  mu = Math.min(mu, Math.PI / 3 - 1e-9);
  const id = 1;
  const is = mu > 1e-12 ? id / (Math.cos(alpha) - Math.cos(alpha + mu)) : 0;
  const a1 = -Math.PI / 3 + alpha;
  const a2 = Math.PI / 3 + alpha;
  const re = new Float64Array(MAX_ORDER + 1);
  const im = new Float64Array(MAX_ORDER + 1);
  for (let h = 1; h <= MAX_ORDER; h += 2) {
    let pr = 0;
    let pi = 0;
    // Flat top.
    const [fr, fi] = expIntegral(h, a1 + mu, a2);
    pr += id * fr;
    pi += id * fi;
    if (mu > 1e-12) {
      // Rising edge: I_s(cos α − cos(θ + π/3)).
      const [er, ei] = expIntegral(h, a1, a1 + mu);
      const [cr, ci] = cosIntegral(h, Math.PI / 3, a1, a1 + mu);
      pr += is * Math.cos(alpha) * er - is * cr;
      pi += is * Math.cos(alpha) * ei - is * ci;
      // Falling edge: I_d − I_s(cos α − cos(θ − π/3)).
      const [gr, gi] = expIntegral(h, a2, a2 + mu);
      const [dr, di] = cosIntegral(h, -Math.PI / 3, a2, a2 + mu);
      pr += (id - is * Math.cos(alpha)) * gr + is * dr;
      pi += (id - is * Math.cos(alpha)) * gi + is * di;
    }
    // Half-wave symmetry: for odd h the negative pulse doubles the positive one's coefficient.
    if (h % 3 !== 0) {
      re[h] = pr / Math.PI;
      im[h] = pi / Math.PI;
    }
  }
  return complexSpectrum(re, im);
}
