// The FFT path cross-checked against a naive DFT (definition) and against mathjs's fft, on random
// multi-tone signals from a seeded PRNG.
import { fft as mathjsFft, type Complex } from "mathjs";
import { describe, expect, test } from "vitest";
import { analyzeSamples } from "@/lib/analysis/analyze-samples";
import { getFft } from "@/lib/analysis/get-fft";
import { mulberry32 } from "./signals";

/** X_k = Σ x_n e^(−2πikn/N): the DFT by its definition, O(N) per bin. */
function naiveBin(x: ArrayLike<number>, k: number): { re: number; im: number } {
  let re = 0;
  let im = 0;
  const n = x.length;
  for (let i = 0; i < n; i++) {
    const a = (-2 * Math.PI * k * i) / n;
    re += x[i]! * Math.cos(a);
    im += x[i]! * Math.sin(a);
  }
  return { re, im };
}

function randomSignal(n: number, seed: number): Float64Array {
  const rnd = mulberry32(seed);
  const tones = Array.from({ length: 12 }, () => ({ k: 1 + Math.floor(rnd() * (n / 2 - 2)), a: rnd() * 10, p: rnd() * 2 * Math.PI }));
  const x = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let v = rnd() - 0.5 + 0.3;
    for (const t of tones) v += t.a * Math.cos((2 * Math.PI * t.k * i) / n + t.p);
    x[i] = v;
  }
  return x;
}

describe.each([256, 1024, 4096])("fft.js real transform, N = %i", (n) => {
  const x = randomSignal(n, n);
  const out = new Float64Array(2 * n);
  getFft(n).realTransform(out, x);
  const scale = Math.max(...Array.from(x, Math.abs)) * n;

  test("matches the naive DFT on every 7th bin (DFT definition)", () => {
    for (let k = 0; k <= n / 2; k += 7) {
      const d = naiveBin(x, k);
      expect(Math.abs(out[2 * k]! - d.re) / scale).toBeLessThan(1e-10);
      expect(Math.abs(out[2 * k + 1]! - d.im) / scale).toBeLessThan(1e-10);
    }
  });

  test("matches mathjs fft on all bins 0..N/2 (general-purpose numeric library)", () => {
    const reference = mathjsFft(Array.from(x)) as unknown as Complex[];
    for (let k = 0; k <= n / 2; k++) {
      expect(Math.abs(out[2 * k]! - reference[k]!.re) / scale).toBeLessThan(1e-10);
      expect(Math.abs(out[2 * k + 1]! - reference[k]!.im) / scale).toBeLessThan(1e-10);
    }
  });
});

test("engine per-order values equal the naive DFT of the raw window when the window is exactly 2^k samples (resampling is then the identity)", () => {
  // 50 Hz, 10 cycles = 2048 samples → no interpolation needed; fundamental estimate ≈ 50 Hz.
  const rate = 10_240;
  const rnd = mulberry32(42);
  const n = 3 * 2048;
  const amplitudes = Array.from({ length: 41 }, (_, h) => (h === 1 ? 10 : rnd() * 2));
  const phases = Array.from({ length: 41 }, () => rnd() * 2 * Math.PI);
  const x = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let v = 0.5;
    for (let h = 1; h <= 40; h++) v += amplitudes[h]! * Math.cos((2 * Math.PI * 50 * h * i) / rate + phases[h]!);
    x[i] = v + 0.01 * (rnd() - 0.5);
  }
  const result = analyzeSamples({ sampleIntervalS: 1 / rate, channels: [{ name: "V", quantity: "voltage", samples: x }] }, { includeOrderSeries: true });
  expect(result.window.points).toBe(2048);
  const series = result.channels[0]!.harmonicSeries!;
  for (let w = 0; w < 3; w++) {
    const window = x.subarray(w * 2048, (w + 1) * 2048);
    for (let h = 1; h <= 40; h++) {
      const d = naiveBin(window, 10 * h);
      const rms = (Math.SQRT2 * Math.hypot(d.re, d.im)) / 2048; // rms = √2·|X_k|/N (unnormalised forward DFT X_k = Σ x_n·e^(−2πikn/N), as fft.js computes it; one-sided peak 2|X_k|/N, r.m.s. = peak/√2)
      expect(Math.abs(series[h - 1]![w]! - rms)).toBeLessThan(1e-5 * 10);
    }
  }
});
