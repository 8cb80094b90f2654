// Distortion indices, power factors and symmetrical components.
import { describe, expect, test } from "vitest";
import { analyzeSamples } from "@/lib/analysis/analyze-samples";
import { computeIndices } from "@/lib/analysis/indices";
import { sequenceComponents } from "@/lib/analysis/sequence";

const params = { resolvableOrder: 50, thdMaxOrder: 40, eddyLossRatio: 0.1, exponent: 1.7 };
const spectrum = (entries: Record<number, number>, top = 50): number[] => Array.from({ length: top + 1 }, (_, h) => entries[h] ?? 0);
const sixPulse = (top: number): number[] => Array.from({ length: 51 }, (_, h) => (h === 1 ? 1 : h <= top && h % 2 === 1 && h % 3 !== 0 ? 1 / h : 0));

describe("computeIndices", () => {
  test("THD of I3 20 %, I5 12 %, I7 4 %, I9 2 % is 23.75 % (THD as defined in IEEE Std 519-2014 §3.1; by hand √(0.2² + 0.12² + 0.04² + 0.02²) = √0.0564 = 23.75 %)", () => {
    expect(computeIndices(spectrum({ 1: 1, 3: 0.2, 5: 0.12, 7: 0.04, 9: 0.02 }), params).thdPercent).toBeCloseTo(23.75, 2);
  });

  test("ideal six-pulse to h = 25: K = 8.30, THD 29.04 % (K = Σ h²·Ih² / Σ Ih², IEEE Std C57.110-2018 / UL 1561 form, from memory; I_h = I1/h: Mohan, Undeland & Robbins, Power Electronics 3rd ed. §5-6; numbers by hand)", () => {
    const r = computeIndices(sixPulse(25), { ...params, resolvableOrder: 25 });
    expect(r.kFactor).toBeCloseTo(8.3, 2);
    expect(r.thdPercent).toBeCloseTo(29.04, 2);
  });

  test("ideal six-pulse to h = 49: K = 15.60, THD 30.02 % (same definitions; by hand Σ_{h≤49} h²·(1/h)² = 17 terms / Σ (1/h)², analytic)", () => {
    const r = computeIndices(sixPulse(49), params);
    expect(r.kFactor).toBeCloseTo(15.6, 2);
    expect(r.thd50Percent!).toBeCloseTo(30.02, 2);
  });

  test("K-factor of a pure sine is 1 and factor K is 1 (definitions, IEEE C57.110 and BS 7821)", () => {
    const r = computeIndices(spectrum({ 1: 5 }), params);
    expect(r.kFactor).toBe(1);
    expect(r.factorK).toBe(1);
  });

  test("BS 7821 factor K = √(1 + e/(1+e)·(I1/I)²·Σ h^q (Ih/I1)²) for I5 = 20 %, e = 0.1, q = 1.7 (BS 7821-4:1995 / EN 50464-3:2007 form, from memory)", () => {
    const r = computeIndices(spectrum({ 1: 1, 5: 0.2 }), params);
    const expected = Math.sqrt(1 + (0.1 / 1.1) * (1 / 1.04) * 5 ** 1.7 * 0.04);
    expect(r.factorK).toBeCloseTo(expected, 12);
  });

  test("PWHD = √Σ_{14..40} h·(Ih/I1)² and PWHC in A (IEC 61000-3-12:2011 clause 3 definitions; IEC 61000-4-7:2002+A1:2008 Annex A form — from memory)", () => {
    const r = computeIndices(spectrum({ 1: 10, 13: 1, 17: 0.5, 41: 3 }), { ...params, irefA: 20 });
    expect(r.pwhcA!).toBeCloseTo(Math.sqrt(17 * 0.25), 12); // orders 13 and 41 are outside 14..40
    expect(r.pwhdPercent!).toBeCloseTo((100 * Math.sqrt(17 * 0.25)) / 10, 12);
    expect(r.thcA).toBeCloseTo(Math.sqrt(1 + 0.25), 12); // THC sums 2..40
    expect(r.thcPercentOfIref!).toBeCloseTo((100 * Math.sqrt(1.25)) / 20, 12);
  });

  test("TDD = √Σ_{2..50} Ih² / IL (IEEE Std 519-2014 §3.1 definition of TDD)", () => {
    const r = computeIndices(spectrum({ 1: 80, 5: 6, 7: 8 }), { ...params, ilA: 100 });
    expect(r.tddPercent!).toBeCloseTo(10, 12);
  });

  test("THD upper order is capped at the resolvable order, PWHD absent without order 40", () => {
    const r = computeIndices(spectrum({ 1: 1, 3: 0.3, 30: 0.1 }), { ...params, resolvableOrder: 20 });
    expect(r.thdMaxOrder).toBe(20);
    expect(r.thdPercent).toBeCloseTo(30, 10);
    expect(r.pwhdPercent).toBeNull();
  });
});

describe("power of a V–I pair from time-domain samples", () => {
  const rate = 12_800;
  const f = 50.02;
  const run = (thd: number, dpf: number, leading = false) => {
    const n = Math.round(0.6 * rate);
    const v = new Float64Array(n);
    const i = new Float64Array(n);
    const phi = Math.acos(dpf) * (leading ? -1 : 1);
    for (let k = 0; k < n; k++) {
      const w = (2 * Math.PI * f * k) / rate;
      v[k] = 230 * Math.SQRT2 * Math.cos(w);
      // current fundamental 10 A lagging by φ, a 5th harmonic giving the THD
      i[k] = 10 * Math.SQRT2 * (Math.cos(w - phi) + thd * Math.cos(5 * w + 0.7));
    }
    return analyzeSamples({
      sampleIntervalS: 1 / rate,
      channels: [
        { name: "Va", quantity: "voltage", phase: "a", samples: v },
        { name: "Ia", quantity: "current", phase: "a", samples: i },
      ],
    }).power.phases[0]!;
  };

  test.each([
    [0.05, 0.9988, 0.8989],
    [0.31, 0.9552, 0.8596],
    [1.0, 0.7071, 0.6364],
  ])("THD %s at DPF 0.9: DF = 1/√(1+THD²) = %s, PF = DPF·DF = %s (IEEE Std 1459-2010 §3.1 with sinusoidal voltage — from memory; numbers by hand)", (thd, df, pf) => {
    const p = run(thd, 0.9);
    expect(p.displacementFactor).toBeCloseTo(0.9, 3);
    expect(p.distortionFactor).toBeCloseTo(df, 3);
    expect(p.truePowerFactor).toBeCloseTo(pf, 3);
    expect(p.truePowerFactor).toBeCloseTo(p.displacementFactor * p.distortionFactor, 4);
    expect(p.activePowerW).toBeCloseTo(230 * 10 * 0.9, 0); // the 5th carries no power: the voltage has none
    expect(p.apparentPowerVA).toBeCloseTo(230 * 10 * Math.sqrt(1 + thd * thd), 0);
  });

  test("sign convention: + when the current lags (inductive), − when it leads (documented in PowerPhase)", () => {
    const lag = run(0.05, 0.8);
    const lead = run(0.05, 0.8, true);
    expect(lag.displacementFactor).toBeCloseTo(0.8, 3);
    expect(lag.displacementAngleDeg!).toBeCloseTo(36.87, 1);
    expect(lead.displacementFactor).toBeCloseTo(-0.8, 3);
    expect(lead.displacementAngleDeg!).toBeCloseTo(-36.87, 1);
    expect(lead.truePowerFactor).toBeGreaterThan(0); // true PF sign follows P, not lead/lag
  });
});

describe("symmetrical components (Fortescue; any power-systems textbook, from memory)", () => {
  const deg = (d: number) => ({ re: Math.cos((d * Math.PI) / 180), im: Math.sin((d * Math.PI) / 180) });

  test("a balanced positive-sequence set is all positive sequence", () => {
    const s = sequenceComponents(deg(0), deg(-120), deg(120));
    expect(Math.hypot(s.positive.re, s.positive.im)).toBeCloseTo(1, 12);
    expect(Math.hypot(s.negative.re, s.negative.im)).toBeCloseTo(0, 12);
    expect(Math.hypot(s.zero.re, s.zero.im)).toBeCloseTo(0, 12);
  });

  test("components recombine: Xa = X0 + X1 + X2 for an arbitrary set", () => {
    const a = { re: 1.2, im: -0.3 };
    const s = sequenceComponents(a, { re: -0.7, im: -0.9 }, { re: -0.2, im: 1.4 });
    expect(s.zero.re + s.positive.re + s.negative.re).toBeCloseTo(a.re, 12);
    expect(s.zero.im + s.positive.im + s.negative.im).toBeCloseTo(a.im, 12);
  });

  test("in a balanced three-phase set the 5th harmonic is negative sequence and the 3rd zero sequence (textbook)", () => {
    const rate = 12_800;
    const n = Math.round(0.4 * rate);
    const channel = (shiftDeg: number, name: string, phase: "a" | "b" | "c") => {
      const x = new Float64Array(n);
      const s = (shiftDeg * Math.PI) / 180;
      for (let k = 0; k < n; k++) {
        const w = (2 * Math.PI * 50 * k) / rate;
        x[k] = 10 * Math.cos(w + s) + 2 * Math.cos(3 * (w + s)) + 1 * Math.cos(5 * (w + s) + 0.3);
      }
      return { name, quantity: "current" as const, phase, samples: x };
    };
    const result = analyzeSamples({ sampleIntervalS: 1 / rate, channels: [channel(0, "Ia", "a"), channel(-120, "Ib", "b"), channel(120, "Ic", "c")] });
    const set = result.sequence![0]!;
    const o = (h: number) => set.orders[h - 1]!;
    expect(o(1).positiveRms!).toBeCloseTo(10 / Math.SQRT2, 3);
    expect(o(3).zeroRms!).toBeCloseTo(2 / Math.SQRT2, 3);
    expect(o(5).negativeRms!).toBeCloseTo(1 / Math.SQRT2, 3);
    expect(o(5).positiveRms!).toBeLessThan(1e-4);
    expect(set.unbalancePercent).toBeLessThan(1e-3);
  });
});
