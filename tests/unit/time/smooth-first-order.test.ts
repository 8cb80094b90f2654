// The IEC 61000-4-7:2002+A1:2008 1.5 s smoothing filter (§5.5.1: first-order low-pass, time constant
// 1.5 s, on each 10/12-cycle window value): step response against its closed form. The expected
// coefficients are written out here from that definition, not taken from the code under test:
// a first-order low-pass sampled every T has y_k = (1 − e^(−T/τ))·x_k + e^(−T/τ)·y_(k−1), i.e.
// α = 1/(1 − e^(−T/τ)) and β = α − 1 in the standard's form y_k = x_k/α + (β/α)·y_(k−1).
import { describe, expect, test } from "vitest";
import { smoothFirstOrder } from "@/lib/analysis/smooth-first-order";
import { smoothingAlpha } from "@/lib/analysis/smoothing-alpha";

const TAU_S = 1.5; // IEC 61000-4-7:2002+A1:2008 §5.5.1
/** α of the standard's discrete form, from the first-order low-pass definition (window T in s). */
const alphaByDefinition = (windowS: number): number => 1 / (1 - Math.exp(-windowS / TAU_S));

describe("smoothingAlpha", () => {
  test("200 ms windows: α = 1/(1 − e^(−0.2/1.5)) = 8.0111, β = α − 1 (IEC 61000-4-7:2002+A1:2008 §5.5.1 prints α = 8.012, β = 7.012 — from memory)", () => {
    const { alpha, beta } = smoothingAlpha(0.2);
    expect(alpha).toBeCloseTo(alphaByDefinition(0.2), 12);
    expect(alpha).toBeCloseTo(8.0111, 4); // 1/(1 − e^(−0.13333)) = 1/0.124826 = 8.0111, by hand
    expect(beta).toBeCloseTo(7.0111, 4);
    // The standard's rounded coefficients agree to 0.001.
    expect(Math.abs(alpha - 8.012)).toBeLessThan(0.002);
  });

  test("a longer window (10 cycles of 49.9 Hz = 200.4 ms) gives a smaller α (derived, not the fixed 8.012)", () => {
    const { alpha, beta } = smoothingAlpha(10 / 49.9);
    expect(alpha).toBeCloseTo(alphaByDefinition(10 / 49.9), 12);
    expect(beta).toBeCloseTo(alphaByDefinition(10 / 49.9) - 1, 12);
    expect(alpha).toBeLessThan(8.0111);
  });

  test.each([0, -1, Number.NaN])("rejects window %s with a consistent message", (windowS) => {
    expect(() => smoothingAlpha(windowS)).toThrow("smoothingAlpha requires a positive window duration");
  });
});

describe("smoothFirstOrder step response", () => {
  const windowS = 0.2;
  const steps = 60; // 12 s
  const y = smoothFirstOrder(new Float64Array(steps).fill(1), windowS, { initial: "zero" });

  // Closed form of a first-order low-pass: 1 − e^(−t/τ), τ = 1.5 s (IEC 61000-4-7:2002+A1:2008 §5.5.1).
  // With α derived from T the discrete form is exact at t = k·T: y_k = 1 − (β/α)^k = 1 − e^(−kT/τ).
  test.each([1, 5, 15, 30, 60])("after %i windows equals 1 − e^(−kT/1.5 s) to 1e-12", (k) => {
    expect(y[k - 1]).toBeCloseTo(1 - Math.exp((-k * windowS) / 1.5), 12);
  });

  test("reaches 1 − e^(−2) = 86.47 % after 2 τ = 3 s (15 windows) (step response of a first-order system, common practice, no source)", () => {
    expect(y[14]).toBeCloseTo(0.864665, 6);
  });

  test("the standard's fixed α = 8.012 would differ from the closed form by < 0.1 % of the step (from memory)", () => {
    const fixed = 1 - Math.pow(7.012 / 8.012, 15);
    expect(Math.abs(fixed - (y[14] as number))).toBeLessThan(1e-3);
  });

  test("default start state (first value) gives a steady output for a steady input (Ordwise choice)", () => {
    expect(Array.from(smoothFirstOrder([2, 2, 2, 2], windowS))).toEqual([2, 2, 2, 2]);
  });

  test("a single 1-window pulse of 1.0 is attenuated to 1/α = 12.5 % (IEC 61000-4-7:2002+A1:2008 §5.5.1 discrete form)", () => {
    const pulse = smoothFirstOrder([0, 1, 0, 0], windowS);
    const a = alphaByDefinition(windowS); // 8.0111
    expect(pulse[1]).toBeCloseTo(1 / a, 12); // 0.12483
    expect(pulse[2]).toBeCloseTo((1 / a) * ((a - 1) / a), 12); // 0.12483 · e^(−0.2/1.5) = 0.10925
  });

  test("rejects an empty series", () => {
    expect(() => smoothFirstOrder([], windowS)).toThrow("smoothFirstOrder requires at least one value");
  });
});
