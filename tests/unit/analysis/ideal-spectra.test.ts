// Ideal waveforms sampled in the time domain (the waveform itself, not a sum of harmonics) through
// the whole engine. Sampling is coherent at M samples per cycle with M divisible by 12 and edge
// samples at the mid value, so the sampled spectrum is the textbook Fourier series plus a known
// alias sum: Σ_m 1/(h + mM) = (π/M)·cot(πh/M) (partial-fraction expansion of the cotangent, any
// complex-analysis text; from memory). Hence order h of a quasi-square wave of conduction β:
//   b_h(sampled) = (4·Id/M)·|sin(hπ/2)·sin(hβ/2)|·cot(πh/M)   (→ 4Id/(hπ)|sin(hβ/2)| as M → ∞).
import { describe, expect, test } from "vitest";
import { analyzeSamples } from "@/lib/analysis/analyze-samples";
import type { ChannelResult } from "@/lib/analysis/types";
import { quasiSquareAt } from "./signals";

const M = 1536; // samples per cycle (divisible by 12 and 4)
const F = 50;

function analyseQuasiSquare(betaDeg: number, id = 1): ChannelResult {
  const n = 2 * 10 * M; // two 10-cycle windows
  const samples = new Float64Array(n);
  for (let k = 0; k < n; k++) samples[k] = quasiSquareAt(k, M, betaDeg, id);
  const result = analyzeSamples({ sampleIntervalS: 1 / (M * F), channels: [{ name: "I", quantity: "current", samples }] });
  return result.channels[0]!;
}

/** Textbook Fourier coefficient (peak) of the quasi-square wave, odd h (any signals & systems text; from memory). */
const textbookPeak = (h: number, betaRad: number, id = 1): number => ((4 * id) / (h * Math.PI)) * Math.abs(Math.sin(h * Math.PI / 2) * Math.sin((h * betaRad) / 2));
/** The same with the alias sum of coherent sampling at M per cycle. */
const sampledPeak = (h: number, betaRad: number, id = 1): number =>
  ((4 * id) / M) * Math.abs(Math.sin((h * Math.PI) / 2) * Math.sin((h * betaRad) / 2)) / Math.tan((Math.PI * h) / M);

const rmsOf = (c: ChannelResult, h: number): number => c.harmonics[h - 1]!.rms!;

describe("square wave (±Id)", () => {
  const c = analyseQuasiSquare(180);

  test.each(Array.from({ length: 25 }, (_, i) => 2 * i + 1))(
    "odd order %i equals 4Id/(hπ)/√2 with the alias correction within 0.05 % (Fourier series of a square wave, textbook; alias sum above)",
    (h) => {
      expect(rmsOf(c, h) / (sampledPeak(h, Math.PI) / Math.SQRT2) - 1).toBeLessThan(5e-4);
      expect(rmsOf(c, h) / (sampledPeak(h, Math.PI) / Math.SQRT2) - 1).toBeGreaterThan(-5e-4);
      // and within 0.5 % of the plain textbook value (aliasing at M = 1536 is below 0.35 % up to h = 50)
      expect(Math.abs(rmsOf(c, h) / (textbookPeak(h, Math.PI) / Math.SQRT2) - 1)).toBeLessThan(5e-3);
    },
  );

  test("even orders are absent: half-wave symmetry (textbook Fourier series property)", () => {
    for (let h = 2; h <= 50; h += 2) expect(rmsOf(c, h)).toBeLessThan(1e-5 * c.fundamentalRms);
  });

  test("I1 = 0.9003·Id r.m.s. (analytic Fourier series of the square wave: b_1 = 4/π, r.m.s. 4/(π√2))", () => {
    expect(c.fundamentalRms).toBeCloseTo(0.9003, 3);
  });

  test("THD 47.03 % to h = 40 and 47.30 % to h = 50 (analytic Fourier series b_n = 4/(nπ), summed by hand)", () => {
    expect(c.thdMaxOrder).toBe(40);
    expect(c.thdPercent).toBeCloseTo(47.03, 1);
    expect(c.thd40Percent!).toBeCloseTo(47.03, 1);
    expect(c.thd50Percent!).toBeCloseTo(47.3, 1);
  });

  test("THD over all orders ≈ 48.3 % = √(π²/8 − 1) from Irms/I1 (analytic: Irms = Id, I1 = 4Id/(π√2); the engine's rms is band-limited to ~order 200, hence 0.5 pp)", () => {
    const thdInfinity = 100 * Math.sqrt((c.rms / c.fundamentalRms) ** 2 - 1);
    expect(Math.abs(thdInfinity - 48.34)).toBeLessThan(0.5);
  });

  test("crest factor of a square wave is 1.0 (analytic: peak = r.m.s. = Id)", () => {
    expect(Math.abs(c.crestFactor - 1)).toBeLessThan(0.01);
  });
});

describe("ideal six-pulse line current (quasi-square, β = 120°)", () => {
  const c = analyseQuasiSquare(120, 10);
  const beta = (2 * Math.PI) / 3;

  test("I1 = (√6/π)·Id (Mohan, Undeland & Robbins, Power Electronics 3rd ed. §5-6; analytic Fourier series of the 120° block)", () => {
    expect(c.fundamentalRms / ((Math.sqrt(6) / Math.PI) * 10) - 1).toBeCloseTo(0, 3);
  });

  test.each([5, 7, 11, 13, 17, 19, 23, 25, 29, 31, 35, 37, 41, 43, 47, 49])(
    "order %i: I_h = I1/h (h = 6k ± 1; Mohan, Undeland & Robbins, Power Electronics 3rd ed. §5-6), exact with the alias correction",
    (h) => {
      const expected = sampledPeak(h, beta, 10) / Math.SQRT2;
      expect(Math.abs(rmsOf(c, h) / expected - 1)).toBeLessThan(5e-4);
      expect(Math.abs(rmsOf(c, h) / (c.fundamentalRms / h) - 1)).toBeLessThan(5e-3);
    },
  );

  test("no triplen and no even orders (Mohan, Undeland & Robbins, Power Electronics 3rd ed. §5-6; analytic Fourier series)", () => {
    for (let h = 2; h <= 50; h++) {
      if (h % 2 === 0 || h % 3 === 0) expect(rmsOf(c, h)).toBeLessThan(1e-5 * c.fundamentalRms);
    }
  });

  test("THD 29.68 % to h = 40 and 30.02 % to h = 50 (analytic I_h = I1/h summed by hand)", () => {
    expect(c.thd40Percent!).toBeCloseTo(29.68, 1);
    expect(c.thd50Percent!).toBeCloseTo(30.02, 1);
  });

  test("K-factor 15.60 over h ≤ 49 (K = Σ h²·Ih² / Σ Ih², IEEE Std C57.110-2018 / UL 1561 form, from memory; with I_h = I1/h, analytic)", () => {
    expect(c.kFactor).toBeCloseTo(15.6, 1);
  });

  test("distortion factor I1/Irms = 3/π = 0.9549 and crest factor 1.2247 (analytic: Irms = Id·√(2/3), I1 = (√6/π)·Id, peak Id)", () => {
    expect(Math.abs(c.fundamentalRms / c.rms - 3 / Math.PI)).toBeLessThan(3e-3);
    expect(Math.abs(c.crestFactor - 1.2247)).toBeLessThan(5e-3);
  });
});

describe("quasi-square wave, β = 150°: b_n = 4Id/(nπ)·sin(nβ/2) (analytic Fourier series of a centred block of width β)", () => {
  const c = analyseQuasiSquare(150);
  const beta = (150 * Math.PI) / 180;
  test.each([1, 3, 5, 7, 9, 11, 13, 15, 17, 19, 21, 23, 25, 27, 29, 31, 33, 35, 37, 39])("order %i", (h) => {
    expect(Math.abs(rmsOf(c, h) - sampledPeak(h, beta) / Math.SQRT2)).toBeLessThan(5e-4 * c.fundamentalRms);
  });
  test("THD over all orders 31.92 % (analytic: Irms = Id·√(β/π) against I1 from the series); band-limited rms, hence 0.5 pp", () => {
    expect(Math.abs(100 * Math.sqrt((c.rms / c.fundamentalRms) ** 2 - 1) - 31.92)).toBeLessThan(0.5);
  });
});

describe("half-wave symmetry", () => {
  const rate = 12_800;
  const symmetric = (theta: number): number =>
    Math.sign(Math.sin(theta)) * Math.abs(Math.sin(theta)) ** 0.3 + 0.2 * Math.sin(3 * theta + 0.4);
  const build = (fn: (t: number) => number): ChannelResult => {
    const n = Math.round(0.6 * rate);
    const samples = new Float64Array(n);
    for (let k = 0; k < n; k++) samples[k] = fn((2 * Math.PI * 49.93 * k) / rate);
    return analyzeSamples({ sampleIntervalS: 1 / rate, channels: [{ name: "I", quantity: "current", samples }] }).channels[0]!;
  };

  test("x(t + T/2) = −x(t) has no even orders (textbook Fourier series property)", () => {
    const c = build(symmetric);
    for (let h = 2; h <= 50; h += 2) expect(rmsOf(c, h)).toBeLessThan(2e-4 * c.fundamentalRms);
    expect(rmsOf(c, 3)).toBeGreaterThan(0.05 * c.fundamentalRms);
  });

  test("the check can fail: adding a half-wave rectified part brings even orders (common practice, no source)", () => {
    const c = build((t) => symmetric(t) + 0.3 * Math.max(0, Math.sin(t)));
    expect(rmsOf(c, 2)).toBeGreaterThan(0.01 * c.fundamentalRms);
  });
});
