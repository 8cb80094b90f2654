// PCC filters against hand calculations written out here.
import { describe, expect, test } from "vitest";
import { allocateActiveFilter } from "@/lib/mitigation/allocate-active-filter";
import { CAPACITOR_LIMITS, passiveFilterAtPcc } from "@/lib/mitigation/passive-filter-at-pcc";

describe("passive single-tuned filter: current divider (hand calculation)", () => {
  // 480 V bus, 300 kvar at 4.7th, q = 30, Isc = 30 kA, X/R = 10.
  //   X_C = 480² / 300 000 = 0.768 Ω;  X_L = 0.768 / 4.7² = 0.768 / 22.09 = 0.0347669 Ω
  //   R   = X_L·4.7/30 = 0.0054468 Ω
  //   X_S = 480 / (√3 · 30 000) = 480 / 51 961.5 = 0.0092376 Ω;  R_S = 0.00092376 Ω
  // 5th: Z_F = 0.0054468 + j(5·0.0347669 − 0.768/5) = 0.0054468 + j0.0202343, |Z_F| = 0.0209546
  //      Z_S = 0.00092376 + j0.0461880;  Z_F + Z_S = 0.0063706 + j0.0664223, |·| = 0.0667271
  //      into the supply: 0.0209546 / 0.0667271 = 0.31403; into the filter: |Z_S|/|Σ| = 0.0461972/0.0667271 = 0.69233
  // 7th: Z_F = 0.0054468 + j(0.2433680 − 0.1097143) = 0.0054468 + j0.1336538, |Z_F| = 0.1337647
  //      Z_F + Z_S = 0.0063706 + j0.1983170, |·| = 0.1984193 → 0.67415
  // 11th: Z_F = 0.0054468 + j0.3126173 (|·| 0.3126648); Σ = 0.0063706 + j0.4142310 (|·| 0.4142800) → 0.75472
  // Parallel resonance: √(0.768 / (0.0347669 + 0.0092376)) = √17.4527 = 4.1777.
  // (Relations: IEEE Std 1531-2020 / Arrillaga & Watson 2nd ed. §8, from memory.)
  const f = passiveFilterAtPcc({ tuningOrder: 4.7, kvar: 300, q: 30, busVoltageV: 480, iscA: 30_000, xOverR: 10 });
  test("impedances", () => {
    expect(f.xcOhm).toBeCloseTo(0.768, 6);
    expect(f.xlOhm).toBeCloseTo(0.0347669, 6);
    expect(f.rOhm).toBeCloseTo(0.0054468, 6);
    expect(f.xsOhm).toBeCloseTo(0.0092376, 6);
  });
  test.each([
    [5, 0.31403, 0.69233],
    [7, 0.67415, 0.32593],
    [11, 0.75472, 0.24529],
  ])("order %i: share into the supply %f, into the filter %f", (h, supply, filter) => {
    expect(f.supplyShare(h)).toBeCloseTo(supply, 4);
    expect(f.filterShare(h)).toBeCloseTo(filter, 4);
  });
  test("parallel resonance with the source at 4.18, below the tuning order", () => {
    expect(f.parallelResonanceOrder).toBeCloseTo(4.1777, 3);
  });
  test("capacitor duty at the fundamental alone: voltage up by h²/(h² − 1) = 22.09/21.09 = 1.0474", () => {
    const duty = f.capacitorDuty(new Map());
    expect(duty.rmsVoltagePercent).toBeCloseTo(104.74, 1);
    expect(duty.peakVoltagePercent).toBeCloseTo(104.74, 1);
    // I = V_ph/(X_C − X_L) = 277.13/0.733233 = 377.95 A; rated 300 000/(√3·480) = 360.84 A → 104.74 %;
    // var = 3·V_C·I = 3 · 290.27 · 377.95 = 329.1 kvar → 109.7 %.
    expect(duty.rmsCurrentPercent).toBeCloseTo(104.74, 1);
    expect(duty.kvarPercent).toBeCloseTo(109.7, 1);
    expect(duty.withinLimits).toBe(true);
    // IEEE Std 18-2012 §5.1 (from memory): 110 % rms V, 120 % peak V, 180 % rms I, 135 % kvar.
    expect(CAPACITOR_LIMITS).toEqual({ rmsVoltagePercent: 110, peakVoltagePercent: 120, rmsCurrentPercent: 180, kvarPercent: 135 });
  });
  test("a large 5th current overloads the capacitor", () => {
    // 400 A of 5th: filter branch 0.69233·400 = 276.9 A; V_C5 = 276.9·0.768/5 = 42.5 V (15.3 % of 277.1 V).
    // rms I = √(377.95² + 276.9²) = 468.5 A = 129.8 %; peak V = 104.74 + 15.34 = 120.1 % > 120 %.
    const duty = f.capacitorDuty(new Map([[5, 400]]));
    expect(duty.rmsCurrentPercent).toBeCloseTo(129.8, 0);
    expect(duty.peakVoltagePercent).toBeCloseTo(120.1, 0);
    expect(duty.withinLimits).toBe(false);
  });
});

describe("active harmonic filter: largest first within the rating (hand calculation)", () => {
  const load = new Map([
    [5, 40],
    [7, 30],
    [11, 20],
    [13, 10],
  ]);
  test("45 A: the 5th cancels (40 A), the 7th gets √(45² − 40²) = √425 = 20.616 A, residual 9.384 A; rating used 45 A", () => {
    const { residualA, ratingUsedA } = allocateActiveFilter(load, 45);
    expect(residualA.get(5)).toBe(0);
    expect(residualA.get(7)).toBeCloseTo(9.3845, 3);
    expect(residualA.get(11)).toBe(20);
    expect(residualA.get(13)).toBe(10);
    expect(ratingUsedA).toBeCloseTo(45, 9);
  });
  test("100 A: all cancel with √(1600 + 900 + 400 + 100) = √3000 = 54.77 A used", () => {
    const { residualA, ratingUsedA } = allocateActiveFilter(load, 100);
    for (const h of [5, 7, 11, 13]) expect(residualA.get(h)).toBe(0);
    expect(ratingUsedA).toBeCloseTo(54.772, 3);
  });
  test("orders outside the band are left alone", () => {
    const { residualA } = allocateActiveFilter(load, 100, { from: 2, to: 9 });
    expect(residualA.get(11)).toBe(20);
    expect(residualA.get(5)).toBe(0);
  });
});
