// The converter front-end models against published relations (sources beside each check).
import { describe, expect, test } from "vitest";
import { activeFrontEndSpectrum } from "@/lib/frontends/active-front-end-spectrum";
import { currentSourceBridgeSpectrum, overlapAngleRad } from "@/lib/frontends/current-source-bridge-spectrum";
import { multiPulseSpectrum } from "@/lib/frontends/multi-pulse-spectrum";
import { simulateSinglePhaseCapacitor } from "@/lib/frontends/simulate-single-phase-capacitor";
import { simulateSixPulseCapacitor } from "@/lib/frontends/simulate-six-pulse-capacitor";
import { spectrumOfCycle } from "@/lib/frontends/spectrum-of-cycle";
import { symmetricalAngleSpectrum } from "@/lib/frontends/symmetrical-angle-spectrum";
import type { FrontEndSpectrum } from "@/lib/frontends/types";

const thd = (s: FrontEndSpectrum): number => {
  let sum = 0;
  for (let h = 2; h <= 50; h++) sum += s.magnitude[h]! ** 2;
  return 100 * Math.sqrt(sum);
};
const deg = (rad: number): number => (rad * 180) / Math.PI;

describe("six-pulse bridge with a large DC inductance (closed form)", () => {
  // Mohan, Undeland, Robbins, Power Electronics, 3rd ed. (2003), §5-6-1: with no overlap the line
  // current is a 120° block; I_h = I_1/h for h = 6k ± 1, no even or triplen orders.
  test.each([5, 7, 11, 13, 17, 19, 23, 25, 29, 31, 35, 37, 41, 43, 47, 49])("no overlap: I_%i / I_1 = 1/h", (h) => {
    expect(currentSourceBridgeSpectrum(0, 0).magnitude[h]).toBeCloseTo(1 / h, 6);
  });
  test("no overlap: no even or triplen orders, fundamental in phase with the voltage (Mohan §5-6-1)", () => {
    const s = currentSourceBridgeSpectrum(0, 0);
    for (let h = 2; h <= 50; h++) if (h % 2 === 0 || h % 3 === 0) expect(s.magnitude[h]).toBeLessThan(1e-9);
    expect(Math.abs(deg(s.phaseRad[1]!))).toBeLessThan(1e-6);
  });
  test("overlap angle from cos α − cos(α+μ) = 2ωL_s·I_d/(√2·V_LL) (Mohan §5-6-2), by hand", () => {
    // X = 5 %, I_1 = (√6/π)I_d → right side = (π/3)·0.05 = 0.0523599; α = 0: cos μ = 0.9476401 → μ = 18.63°.
    expect(deg(overlapAngleRad(0, 5)!)).toBeCloseTo(18.63, 1);
    // α = 30°: cos(30° + μ) = 0.8660254 − 0.0523599 = 0.8136655 → 35.55°, μ = 5.55°.
    expect(deg(overlapAngleRad(Math.PI / 6, 5)!)).toBeCloseTo(5.55, 1);
  });
  test.each([
    [0, 5],
    [30, 5],
    [45, 10],
    [20, 15],
  ])("α = %i°, X = %i %%: displacement factor ≈ cos(α + μ/2) (Mohan §6-3-3), exactly Arrillaga's tan φ", (alphaDeg, x) => {
    const alpha = (alphaDeg * Math.PI) / 180;
    const mu = Math.acos(Math.cos(alpha) - (Math.PI / 3) * (x / 100)) - alpha;
    const s = currentSourceBridgeSpectrum(alphaDeg, x);
    // The current lags. cos(α + μ/2) is an approximation, good to about 0.01 for μ up to ~20°.
    expect(s.phaseRad[1]!).toBeLessThan(0);
    expect(Math.abs(Math.cos(s.phaseRad[1]!) - Math.cos(alpha + mu / 2))).toBeLessThan(0.012);
    // The fundamental's angle with overlap, exactly (Arrillaga & Watson, Power System Harmonics,
    // 2nd ed. 2003, §4.3 — from memory): tan φ = (2μ + sin 2α − sin 2(α+μ)) / (cos 2α − cos 2(α+μ)).
    const tanPhi = (2 * mu + Math.sin(2 * alpha) - Math.sin(2 * (alpha + mu))) / (Math.cos(2 * alpha) - Math.cos(2 * (alpha + mu)));
    expect(-s.phaseRad[1]!).toBeCloseTo(Math.atan(tanPhi), 4);
  });
  test("overlap lowers the 11th and 13th below 1/h more than the 5th and 7th (Mohan §5-6-2, qualitative)", () => {
    const s = currentSourceBridgeSpectrum(0, 8);
    const ratio = (h: number): number => s.magnitude[h]! * h;
    expect(ratio(5)).toBeLessThan(1);
    expect(ratio(11)).toBeLessThan(ratio(5));
    expect(ratio(13)).toBeLessThan(ratio(7));
  });
});

describe("multi-pulse", () => {
  const six = currentSourceBridgeSpectrum(0, 0);
  test("twelve-pulse cancels 5, 7, 17, 19 and keeps 11, 13 at I_1/h (Mohan §5-6; Arrillaga & Watson 2nd ed. §4.4, from memory)", () => {
    const s = multiPulseSpectrum(six, 12, 0);
    for (const h of [5, 7, 17, 19, 29, 31, 41, 43]) expect(s.magnitude[h]).toBeLessThan(1e-9);
    for (const h of [11, 13, 23, 25, 35, 37, 47, 49]) expect(s.magnitude[h]).toBeCloseTo(1 / h, 6);
  });
  test("eighteen-pulse leaves only h = 18k ± 1 (Arrillaga & Watson 2nd ed. §4.4, from memory)", () => {
    const s = multiPulseSpectrum(six, 18, 0);
    for (let h = 2; h <= 50; h++) {
      if (h === 17 || h === 19 || h === 35 || h === 37) expect(s.magnitude[h]).toBeCloseTo(1 / h, 6);
      else expect(s.magnitude[h]).toBeLessThan(1e-9);
    }
  });
  test("twelve-pulse with 2 % imbalance: residual 5th = ε·I_5 with ε = 1 % (hand calculation)", () => {
    // Bridges carry 1.01 and 0.99: 5th = (1.01 − 0.99)·(1/5) / (1.01 + 0.99) = 0.002.
    expect(multiPulseSpectrum(six, 12, 2).magnitude[5]).toBeCloseTo(0.002, 6);
  });
});

describe("symmetrical conduction angle (quasi-square wave)", () => {
  // Fourier series of a rectangular pulse (textbook result, from memory): odd orders only,
  // I_h/I_1 = sin(hβ/2)/(h·sin(β/2)).
  const published = (h: number, betaDeg: number): number => {
    const b = (betaDeg * Math.PI) / 180;
    return Math.abs(Math.sin((h * b) / 2) / (h * Math.sin(b / 2)));
  };
  test.each([60, 90, 120, 150])("β = %i°: I_h/I_1 = sin(hβ/2)/(h·sin(β/2)), no even orders", (beta) => {
    const s = symmetricalAngleSpectrum(beta);
    for (let h = 2; h <= 50; h++) {
      if (h % 2 === 0) expect(s.magnitude[h]).toBe(0);
      else expect(s.magnitude[h]).toBeCloseTo(published(h, beta), 9);
    }
  });
  test("β = 120°: the triplens vanish; β = 180°: square wave, I_h = I_1/h and THD 48.34 % to order 50 ≈ 48.1 %", () => {
    const s = symmetricalAngleSpectrum(120);
    for (const h of [3, 9, 15, 21, 27, 33, 39, 45]) expect(s.magnitude[h]).toBe(0);
    const square = symmetricalAngleSpectrum(180);
    for (const h of [3, 5, 7, 49]) expect(square.magnitude[h]).toBeCloseTo(1 / h, 9);
    // THD of a square wave, all orders: √(π²/8 − 1) = 48.34 % (from memory); to order 50 the tail
    // Σ_{h odd > 50} 1/h² ≈ 1/100 is missing: √(0.23370 − 0.00990) = 47.3 %.
    expect(thd(square)).toBeCloseTo(100 * Math.sqrt((Math.PI * Math.PI) / 8 - 1 - 0.0099), 0);
  });
  test("the model's own DFT (spectrumOfCycle) of a sampled quasi-square wave agrees with the series", () => {
    const n = 3600;
    const beta = 100;
    const samples = Array.from({ length: n }, (_, k) => {
      const thDeg = (k * 360) / n;
      const d = Math.min(Math.abs(thDeg), Math.abs(thDeg - 360));
      if (d < beta / 2) return 1;
      if (Math.abs(thDeg - 180) < beta / 2) return -1;
      return 0;
    });
    const s = spectrumOfCycle(samples, 0);
    for (const h of [3, 5, 7, 11]) expect(s.magnitude[h]).toBeCloseTo(published(h, beta), 2);
  });
});

describe("capacitor-input rectifiers (time-domain simulation)", () => {
  test("single-phase: THD well above 80 % at low line inductance, falling as it rises; strong 3rd; no even orders (common practice, no source)", () => {
    const values = [0.1, 0.5, 2, 5, 10].map((l) => simulateSinglePhaseCapacitor({ lineInductancePercent: l, capacitorPu: 20 }));
    expect(thd(values[0]!)).toBeGreaterThan(100);
    expect(thd(values[1]!)).toBeGreaterThan(80);
    for (let k = 1; k < values.length; k++) expect(thd(values[k]!)).toBeLessThan(thd(values[k - 1]!));
    for (const s of values) {
      expect(s.magnitude[3]).toBeGreaterThan(s.magnitude[5]!);
      for (const h of [2, 4, 6]) expect(s.magnitude[h]).toBeLessThan(0.01);
    }
  });
  test("six-pulse drive: THD ranges by AC reactance, no even or triplen orders (common practice, no source; ±30 % bounds)", () => {
    const at = (ac: number, dc = 0) => simulateSixPulseCapacitor({ acInductancePercent: ac, dcChokePercent: dc, loadPercent: 100 });
    const stiff = thd(at(0.3));
    const three = thd(at(3));
    const five = thd(at(5));
    expect(stiff).toBeGreaterThan(80);
    expect(three).toBeGreaterThan(35 * 0.7);
    expect(three).toBeLessThan(45 * 1.3);
    expect(five).toBeGreaterThan(30 * 0.7);
    expect(five).toBeLessThan(38 * 1.3);
    expect(five).toBeLessThan(three);
    // A DC choke lowers the distortion as an AC reactor does.
    expect(thd(at(0.3, 3))).toBeLessThan(stiff / 1.5);
    const s = at(1);
    for (let h = 2; h <= 50; h++) if (h % 2 === 0 || h % 3 === 0) expect(s.magnitude[h]).toBeLessThan(0.01);
    // Diode bridge: the fundamental is close to the voltage (within 25°).
    expect(Math.abs(deg(s.phaseRad[1]!))).toBeLessThan(25);
  });
});

describe("active front end", () => {
  test("the low-order residual is the r.s.s. asked for; sidebands at the switching order ± 2 and ± 4", () => {
    const s = activeFrontEndSpectrum(3, 40, 2);
    let sum = 0;
    for (let h = 2; h <= 13; h++) sum += s.magnitude[h]! ** 2;
    expect(100 * Math.sqrt(sum)).toBeCloseTo(3, 9);
    expect(s.magnitude[38]).toBeCloseTo(0.02, 9);
    expect(s.magnitude[42]).toBeCloseTo(0.02, 9);
    expect(s.magnitude[36]).toBeCloseTo(0.006, 9);
    expect(s.magnitude[40]).toBe(0);
    // Switching at 60× the fundamental: no sideband falls on orders ≤ 50.
    const high = activeFrontEndSpectrum(3, 60, 2);
    for (let h = 14; h <= 50; h++) expect(high.magnitude[h]).toBe(0);
  });
});
