import { describe, expect, test } from "vitest";
import type { ComplianceRow } from "@/lib/compliance/result";
import { spectrumBars } from "@/lib/reports/spectrum-bars";

// IEEE Std 519-2014 Table 2, 20 ≤ Isc/IL < 50: h5 limit 7.0 % of IL; the daily 99th percentile of 3 s
// values may reach 2 × the limit (IEEE Std 519-2014 clause 5.2). The bars must be the value each verdict
// compared, converted from %IL to amperes with IL (independent arithmetic written out below).
const IL_A = 200;

function row(partial: Partial<ComplianceRow> & Pick<ComplianceRow, "order" | "measured" | "limit" | "unit" | "verdict">): ComplianceRow {
  return { percentOfLimit: null, margin: null, ...partial } as ComplianceRow;
}

describe("spectrum bars: the value shown is the value judged", () => {
  test("a %IL row decided by the daily p99 rule shows that rule's 3 s value and 2 × the limit, in amperes", () => {
    // The capture r.m.s. mean of h5 is 10 A (5 %IL); the rule's p99 of 3 s values is 9.1 %IL = 18.2 A;
    // its limit 2 × 7.0 %IL = 14 %IL = 0.14 × 200 A = 28 A.
    const rows = [row({ order: 5, unit: "%IL", measured: 9.1, limit: 14, verdict: "pass", decidedBy: "daily-p99-very-short" })];
    const [bar] = spectrumBars([{ order: 5, rms: 10 }], rows, { fundamentalRms: 150, ilA: IL_A });
    expect(bar!.value).toBeCloseTo(18.2, 9);
    expect(bar!.limit).toBeCloseTo(28, 9);
    expect(bar!.byTimeRule).toBe(true);
  });

  test("a row decided by the capture mean keeps the r.m.s. mean and its limit 7.0 % × 200 A = 14 A", () => {
    const rows = [row({ order: 5, unit: "%IL", measured: 5, limit: 7, verdict: "pass", decidedBy: "snapshot" })];
    const [bar] = spectrumBars([{ order: 5, rms: 10 }], rows, { fundamentalRms: 150, ilA: IL_A });
    expect(bar).toEqual({ order: 5, value: 10, limit: expect.closeTo(14, 9), failing: false, byTimeRule: false });
  });

  test("a failing ampere row decided by the 1.5 s smoothed maximum shows 3.54 A against 1.5 × 2.30 A (IEC 61000-3-2 Table 1 h3, clause 6.2)", () => {
    const rows = [row({ order: 3, unit: "A", measured: 3.54, limit: 3.45, verdict: "fail", decidedBy: "smoothed-max" })];
    const [bar] = spectrumBars([{ order: 3, rms: 2.1 }], rows, { fundamentalRms: 8 });
    expect(bar).toEqual({ order: 3, value: 3.54, limit: 3.45, failing: true, byTimeRule: true });
  });

  test("%I1 rows scale by the fundamental; an unknown base keeps the capture mean and never a mis-scaled mark", () => {
    // 4 % of an 8 A fundamental = 0.32 A.
    const pct = spectrumBars([{ order: 7, rms: 0.2 }], [row({ order: 7, unit: "%I1", measured: 2.5, limit: 4, verdict: "pass" })], { fundamentalRms: 8 });
    expect(pct[0]!.limit).toBeCloseTo(0.32, 12);
    expect(pct[0]!.value).toBe(0.2);
    // %IL without IL, decided by a rule: the bar stays the mean, the mark is left out.
    const unknown = spectrumBars([{ order: 5, rms: 10 }], [row({ order: 5, unit: "%IL", measured: 9.1, limit: 14, verdict: "pass", decidedBy: "daily-p99-very-short" })], { fundamentalRms: 150 });
    expect(unknown[0]).toEqual({ order: 5, value: 10, limit: null, failing: false, byTimeRule: false });
  });
});
