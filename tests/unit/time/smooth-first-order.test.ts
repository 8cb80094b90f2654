// The IEC 61000-4-7 1.5 s smoothing filter: step response against its closed form.
import { describe, expect, test } from "vitest";
import { smoothFirstOrder } from "@/lib/analysis/smooth-first-order";
import { smoothingAlpha } from "@/lib/analysis/smoothing-alpha";

describe("smoothingAlpha", () => {
  test("200 ms windows: α = 1/(1 − e^(−0.2/1.5)) = 8.0111, β = α − 1 (IEC 61000-4-7 gives α = 8.012, β = 7.012 — from memory; reference §4.4 check X)", () => {
    const { alpha, beta } = smoothingAlpha(0.2);
    expect(alpha).toBeCloseTo(8.0111, 4);
    expect(beta).toBeCloseTo(alpha - 1, 12);
    // The standard's rounded coefficients agree to 0.001.
    expect(Math.abs(alpha - 8.012)).toBeLessThan(0.002);
  });

  test("a longer window (10 cycles of 49.9 Hz = 200.4 ms) gives a smaller α (derived, not the fixed 8.012)", () => {
    expect(smoothingAlpha(10 / 49.9).alpha).toBeLessThan(smoothingAlpha(0.2).alpha);
  });

  test.each([0, -1, Number.NaN])("rejects window %s with a consistent message", (windowS) => {
    expect(() => smoothingAlpha(windowS)).toThrow("smoothingAlpha requires a positive window duration");
  });
});

describe("smoothFirstOrder step response", () => {
  const windowS = 0.2;
  const steps = 60; // 12 s
  const y = smoothFirstOrder(new Float64Array(steps).fill(1), windowS, { initial: "zero" });

  // Closed form of a first-order low-pass: 1 − e^(−t/τ), τ = 1.5 s (IEC 61000-4-7, confirmed).
  // With α derived from T the discrete form is exact at t = k·T: y_k = 1 − (β/α)^k = 1 − e^(−kT/τ).
  test.each([1, 5, 15, 30, 60])("after %i windows equals 1 − e^(−kT/1.5 s) to 1e-12", (k) => {
    expect(y[k - 1]).toBeCloseTo(1 - Math.exp((-k * windowS) / 1.5), 12);
  });

  test("reaches 1 − e^(−2) = 86.47 % after 2 τ = 3 s (15 windows) (first-order response, textbook)", () => {
    expect(y[14]).toBeCloseTo(0.864665, 6);
  });

  test("the standard's fixed α = 8.012 would differ from the closed form by < 0.1 % of the step (from memory)", () => {
    const fixed = 1 - Math.pow(7.012 / 8.012, 15);
    expect(Math.abs(fixed - (y[14] as number))).toBeLessThan(1e-3);
  });

  test("default start state (first value) gives a steady output for a steady input (Ordwise choice)", () => {
    expect(Array.from(smoothFirstOrder([2, 2, 2, 2], windowS))).toEqual([2, 2, 2, 2]);
  });

  test("a single 1-window pulse of 1.0 is attenuated to 1/α = 12.5 % (IEC 61000-4-7 discrete form)", () => {
    const pulse = smoothFirstOrder([0, 1, 0, 0], windowS);
    expect(pulse[1]).toBeCloseTo(1 / smoothingAlpha(windowS).alpha, 12);
    expect(pulse[2]).toBeCloseTo((1 / smoothingAlpha(windowS).alpha) * (smoothingAlpha(windowS).beta / smoothingAlpha(windowS).alpha), 12);
  });

  test("rejects an empty series", () => {
    expect(() => smoothFirstOrder([], windowS)).toThrow("smoothFirstOrder requires at least one value");
  });
});
