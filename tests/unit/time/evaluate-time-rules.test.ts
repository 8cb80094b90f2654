// Time rules in the evaluator: IEC 61000-3-2:2018+A1:2020 clause 6.2 smoothed average / 150 % maximum / POHC allowance /
// Class A 200 % relaxation, IEEE Std 519-2014 §5.2 percentiles, and records too short for a rule.
import { describe, expect, test } from "vitest";
import { evaluateCompliance } from "@/lib/compliance/evaluate-compliance";
import type { EvaluationContext, LimitSetRevisionContentInput } from "@/lib/compliance/model";
import type { ComplianceResult, ComplianceRow } from "@/lib/compliance/result";
import { getSeedLimitSet } from "@/lib/compliance/seed";
import { burst, makeSeriesAnalysis, type SeriesChannelSpec } from "./make-series-analysis";
import type { AnalysisResult } from "@/lib/analysis/types";

function run(key: string, analysis: AnalysisResult, context: EvaluationContext = {}, content?: LimitSetRevisionContentInput): ComplianceResult {
  const set = getSeedLimitSet(key)!;
  return evaluateCompliance({
    analysis,
    limitSet: { key, name: set.name, revision: { id: "test", number: 1 }, content: content ?? set.content },
    context,
  });
}

function row(result: ComplianceResult, order: number): ComplianceRow {
  const found = result.rows.find((candidate) => candidate.order === order);
  if (!found) throw new Error(`no row ${order}`);
  return found;
}

function rule(found: ComplianceRow, id: string) {
  const result = found.rowRules?.find((candidate) => candidate.rule === id);
  if (!result) throw new Error(`no rule ${id}`);
  return result;
}

const SECONDS = (s: number): number => Math.round(s / 0.2);
const classA = (orders: SeriesChannelSpec["orders"], seconds = 120): AnalysisResult =>
  makeSeriesAnalysis(SECONDS(seconds), [{ name: "I", fundamental: 5, orders }]);

describe("IEC 61000-3-2:2018+A1:2020 Class A: average of 1.5 s smoothed values and the 150 % rule (order 11, limit 0.33 A — Table 1, as printed)", () => {
  test("passes the average but fails the maximum: 20 s at 0.6 A in 120 s at 0.2 A (clause 6.2: smoothed values ≤ 150 % — from memory)", () => {
    const result = run("iec-61000-3-2-class-a", classA({ 11: burst(50, 70, 0.6, 0.2) }));
    const h11 = row(result, 11);
    // Average ≈ (100·0.2 + 20·0.6)/120 = 0.267 A ≤ 0.33 A (IEC 61000-3-2:2018+A1:2020 clause 6.2, averaging as printed).
    expect(rule(h11, "smoothed-average").verdict).toBe("pass");
    expect(rule(h11, "smoothed-average").measured).toBeCloseTo(0.2667, 2);
    // Smoothed maximum = 0.2 + 0.4·(1 − e^(−20/1.5)) ≈ 0.6 A > 1.5 × 0.33 = 0.495 A.
    expect(rule(h11, "smoothed-max")).toMatchObject({ verdict: "fail", limit: expect.closeTo(0.495, 9), tableLimit: 0.33, multiplier: 1.5 });
    expect(rule(h11, "smoothed-max").measured).toBeCloseTo(0.2 + 0.4 * (1 - Math.exp(-20 / 1.5)), 6);
    expect(h11).toMatchObject({ verdict: "fail", decidedBy: "smoothed-max" });
    expect(h11.measured).toBeCloseTo(0.6, 3);
    expect(h11.limit).toBeCloseTo(0.495, 9);
    // IEC 61000-3-2:2018+A1:2020 Table 1, n = 11: 0.33 A; the 150 % rule allows 0.495 A; the maximum 0.6 A exceeds it.
    expect(h11.reason).toContain("decided by “Every 1.5 s smoothed value ≤ 150 % of the limit”: maximum of 1.5 s smoothed values over the observation period = 0.6 A against 1.5 × the table limit 0.33 A = 0.495 A");
    expect(result.verdict).toBe("fail");
  });

  test("fails the average but passes the maximum: a steady 0.36 A = 109 % (IEC 61000-3-2:2018+A1:2020 clause 6.2 average ≤ 100 % — averaging as printed, '≤' from memory)", () => {
    const result = run("iec-61000-3-2-class-a", classA({ 11: () => 0.36 }));
    const h11 = row(result, 11);
    expect(rule(h11, "smoothed-max").verdict).toBe("pass");
    expect(rule(h11, "smoothed-average")).toMatchObject({ verdict: "fail", limit: 0.33 });
    expect(rule(h11, "smoothed-average").measured).toBeCloseTo(0.36, 12);
    expect(h11).toMatchObject({ verdict: "fail", decidedBy: "smoothed-average", limit: 0.33 });
    expect(h11.percentOfLimit).toBeCloseTo(109.09, 2);
  });

  test("a single 200 ms spike to 0.8 A is attenuated by the 1.5 s filter to 0.2 + 0.6/α ≈ 0.275 A and passes (IEC 61000-4-7:2002+A1:2008 §5.5.1 smoothing)", () => {
    const result = run("iec-61000-3-2-class-a", classA({ 11: burst(60, 60.2, 0.8, 0.2) }));
    const h11 = row(result, 11);
    expect(rule(h11, "smoothed-max").measured).toBeCloseTo(0.2 + 0.6 / 8.0111, 4);
    expect(h11.verdict).toBe("pass");
  });

  test("a steady load gives the same verdicts as the snapshot, and the summary lists both rules as applied", () => {
    const result = run("iec-61000-3-2-class-a", classA({ 3: () => 2.0, 5: () => 1.0 }));
    expect(result.verdict).toBe("pass");
    expect(row(result, 3)).toMatchObject({ verdict: "pass", decidedBy: "smoothed-average" });
    expect(result.timeRules?.map((summary) => [summary.rule, summary.status])).toEqual([
      ["smoothed-average", "applied"],
      ["smoothed-max", "applied"],
    ]);
    expect(result.timeBasis).toMatchObject({ source: "windows", valueCount: 600, coverage: "all", startMs: null });
    expect(result.timeBasis?.durationS).toBeCloseTo(120, 9);
  });
});

describe("IEC 61000-3-2:2018+A1:2020 clause 7 POHC allowance on the smoothed average (odd 21–39, 50 %, from memory; POHC limit Class A √Σ_{n=21,23…39} (2.25/n)² = 0.2514 A, by hand from Table 1)", () => {
  const limit21 = (0.15 * 15) / 21; // 0.10714 A, IEC 61000-3-2:2018+A1:2020 Table 1 formula 0.15·15/n

  test("I21 = 0.14 A (130.7 %) alone: POHC 0.14 A ≤ 0.2514 A and every smoothed value ≤ 150 % → passes by the allowance", () => {
    const h21 = row(run("iec-61000-3-2-class-a", classA({ 21: () => 0.14 })), 21);
    expect(rule(h21, "smoothed-average")).toMatchObject({ verdict: "pass" });
    expect(rule(h21, "smoothed-average").limit).toBeCloseTo(limit21 * 1.5, 9);
    expect(rule(h21, "smoothed-average").reason).toContain("allowance applies");
    expect(h21.verdict).toBe("pass");
  });

  test("same average, but 10 s bursts to 0.2 A (> 150 % = 0.1607 A) fail the maximum, so the allowance does not apply", () => {
    // Mean kept near 0.13 A: 110 s at 0.1282 A and 10 s at 0.2 A.
    const h21 = row(run("iec-61000-3-2-class-a", classA({ 21: burst(40, 50, 0.2, 0.1282) })), 21);
    expect(rule(h21, "smoothed-max").verdict).toBe("fail");
    expect(rule(h21, "smoothed-average")).toMatchObject({ verdict: "fail" });
    expect(rule(h21, "smoothed-average").reason).toContain("allowance does not apply");
    expect(h21.verdict).toBe("fail");
  });

  test("every odd order 21–39 at 130 % of its limit: POHC = 1.3 × 0.2514 A exceeds its limit → fails", () => {
    const orders: Record<number, () => number> = {};
    for (let h = 21; h <= 39; h += 2) orders[h] = () => (1.3 * 2.25) / h;
    const result = run("iec-61000-3-2-class-a", classA(orders));
    expect(result.aggregates.find((aggregate) => aggregate.name === "POHC")).toMatchObject({ verdict: "fail" });
    expect(result.aggregates.find((aggregate) => aggregate.name === "POHC")?.measured).toBeCloseTo(1.3 * 0.2514, 3);
    expect(row(result, 21).verdict).toBe("fail");
    expect(rule(row(result, 21), "smoothed-average").reason).toContain("POHC exceeds its limit");
  });
});

describe("IEC 61000-3-2:2018+A1:2020 clause 6.2 Class A 200 % relaxation (from memory; data, off unless enabled)", () => {
  // 5 s at 0.6 A (182 %) in 120 s at 0.25 A: excursion above 150 % < min(10 % of 120 s, 10 min); average ≈ 0.265 A < 90 % of 0.33 A.
  const analysis = classA({ 11: burst(60, 65, 0.6, 0.25) });
  const seed = getSeedLimitSet("iec-61000-3-2-class-a")!.content;

  test("disabled in the seed: the 0.59 A smoothed maximum fails 150 %", () => {
    expect(row(run("iec-61000-3-2-class-a", analysis), 11)).toMatchObject({ verdict: "fail", decidedBy: "smoothed-max" });
  });

  test("enabled in a revision: passes against 200 % with the conditions quoted", () => {
    const content = structuredClone(seed);
    const maxRule = content.rules.timeRules!.find((candidate) => candidate.id === "smoothed-max")!;
    maxRule.relaxation = { ...maxRule.relaxation!, enabled: true };
    const h11 = row(run("iec-61000-3-2-class-a", analysis, {}, content), 11);
    expect(rule(h11, "smoothed-max")).toMatchObject({ verdict: "pass", limit: 0.66 });
    expect(rule(h11, "smoothed-max").reason).toContain("relaxation to 200 % applies");
    expect(h11.verdict).toBe("pass");
  });

  test("enabled, but a 30 s excursion (> 10 % of 120 s) does not qualify", () => {
    const content = structuredClone(seed);
    const maxRule = content.rules.timeRules!.find((candidate) => candidate.id === "smoothed-max")!;
    maxRule.relaxation = { ...maxRule.relaxation!, enabled: true };
    const h11 = row(run("iec-61000-3-2-class-a", classA({ 11: burst(60, 90, 0.6, 0.15) }), {}, content), 11);
    expect(rule(h11, "smoothed-max").verdict).toBe("fail");
    expect(rule(h11, "smoothed-max").reason).toMatch(/relaxation to 200 % does not apply: .*excursions above 150 %/);
  });
});

describe("IEEE Std 519-2014 current percentiles on a 20-minute capture (§5.2 multipliers from memory)", () => {
  // Isc/IL = 100 at 480 V → Table 2 row 100 ≤ Isc/IL < 1000: h5 limit 12 % of IL (IEEE Std 519-2014 Table 2, as printed). IL = 100 A so A = % of IL.
  const context: EvaluationContext = { iscA: 10_000, ilA: 100, busVoltageV: 480 };
  // 400 three-second blocks (15 windows each); block i (1-based) carries 0.05·i A of h5.
  const analysis = makeSeriesAnalysis(6000, [{ name: "Ia", fundamental: 100, orders: { 5: (k) => 0.05 * (Math.floor(k / 15) + 1) } }]);
  const result = run("ieee-519-2014-current", analysis, context);
  const h5 = row(result, 5);

  test("daily 99th percentile of 3 s values = the 396th of 400 = 19.8 % < 2.0 × 12 % (nearest rank)", () => {
    expect(rule(h5, "daily-p99-very-short")).toMatchObject({ verdict: "pass", limit: 24, valueCount: 400, periodCount: 1 });
    expect(rule(h5, "daily-p99-very-short").measured).toBeCloseTo(19.8, 9);
    expect(rule(h5, "daily-p99-very-short").reason).toContain("the standard accumulates over 24 h; evaluated over the available 20 min");
  });

  test("two 10-min values 5.795 % and 15.30 %: weekly p95 = 15.30 % fails 1.0 × 12 %, p99 passes 1.5 × 12 %", () => {
    // r.m.s. of 0.05·i for i = 1..200 and i = 201..400 (closed-form sums of squares).
    const second = 0.05 * Math.sqrt((400 * 401 * 801 - 200 * 201 * 401) / 6 / 200);
    expect(second).toBeCloseTo(15.2997, 3);
    expect(rule(h5, "weekly-p95-short").measured).toBeCloseTo(second, 9);
    expect(rule(h5, "weekly-p95-short")).toMatchObject({ verdict: "fail", limit: 12, valueCount: 2 });
    expect(rule(h5, "weekly-p99-short")).toMatchObject({ verdict: "pass", limit: 18 });
    expect(h5).toMatchObject({ verdict: "fail", decidedBy: "weekly-p95-short" });
  });

  test("TDD is judged by the same rules (only h5 present, so TDD = h5)", () => {
    const tdd = result.aggregates.find((aggregate) => aggregate.name === "TDD")!;
    expect(tdd.rowRules?.map((candidate) => candidate.rule)).toEqual(["daily-p99-very-short", "weekly-p99-short", "weekly-p95-short"]);
    expect(tdd.rowRules?.[2]?.measured).toBeCloseTo(rule(h5, "weekly-p95-short").measured!, 9);
  });

  test("a start time aligns 10-minute values to the clock: 12:05 → one complete interval 12:10–12:20", () => {
    const aligned = evaluateCompliance({
      analysis,
      limitSet: { key: "k", name: "n", revision: { id: 1, number: 1 }, content: getSeedLimitSet("ieee-519-2014-current")!.content },
      context,
      recordStartMs: Date.UTC(2024, 2, 4, 12, 5, 0),
    });
    expect(rule(row(aligned, 5), "weekly-p95-short").valueCount).toBe(1);
    expect(aligned.timeBasis?.startMs).toBe(Date.UTC(2024, 2, 4, 12, 5, 0));
  });
});

describe("records too short for a rule → not-evaluated with the minimum duration", () => {
  test("IEEE 519: a 2-minute capture evaluates the 3 s rule; the 10-minute rules need ≥ 10 min and the capture mean stands in", () => {
    const analysis = makeSeriesAnalysis(600, [{ name: "Ia", fundamental: 100, orders: { 5: () => 10 } }]);
    const result = run("ieee-519-2014-current", analysis, { iscA: 10_000, ilA: 100, busVoltageV: 480 });
    const h5 = row(result, 5);
    expect(rule(h5, "daily-p99-very-short").verdict).toBe("pass");
    expect(rule(h5, "weekly-p95-short")).toMatchObject({
      verdict: "not-evaluated",
      reason: "not evaluated: needs at least 10 min of record; the record has 2 min",
    });
    expect(rule(h5, "snapshot")).toMatchObject({ verdict: "pass", measured: 10, limit: 12 });
    expect(h5.verdict).toBe("pass");
    expect(result.timeBasis?.coverage).toBe("partial");
    expect(result.timeRules?.find((summary) => summary.rule === "weekly-p99-short")).toMatchObject({
      status: "not-evaluated",
      reason: "needs at least 10 min of record; the record has 2 min",
    });
    expect(result.notes).toContain("“Weekly 99th percentile of 10 min values < 1.5 × limit” and “Weekly 95th percentile of 10 min values < 1.0 × limit” were not applied: needs at least 10 min of record; the record has 2 min.");
    expect(result.notes).toContain("Where a time rule could not be applied, each order's r.m.s. mean over the record was compared with 1.0 × its table limit instead.");
  });

  test("IEC 61000-3-2: a 2-window capture (0.4 s) cannot use the 1.5 s rules; the snapshot comparison decides (I3 2.5 A > 2.30 A, Table 1)", () => {
    const analysis = makeSeriesAnalysis(2, [{ name: "I", fundamental: 8, orders: { 3: () => 2.5 } }]);
    const h3 = row(run("iec-61000-3-2-class-a", analysis), 3);
    expect(rule(h3, "smoothed-average").reason).toBe("not evaluated: needs at least 1.5 s of record; the record has 0.4 s");
    expect(h3).toMatchObject({ verdict: "fail", decidedBy: "snapshot", measured: 2.5, limit: 2.3 });
  });

  test("without per-window series the time rules are listed as not evaluated and the snapshot decides", () => {
    const analysis = makeSeriesAnalysis(10, [{ name: "I", fundamental: 8, orders: { 3: () => 2.5 } }]);
    delete analysis.channels[0]!.harmonicSeries;
    const result = run("iec-61000-3-2-class-a", analysis);
    expect(row(result, 3)).toMatchObject({ verdict: "fail", decidedBy: "snapshot" });
    expect(result.timeBasis).toMatchObject({ source: "none", coverage: "none" });
    expect(result.timeRules?.[0]).toMatchObject({ status: "not-evaluated", cause: { code: "no-order-series" } });
    expect(result.timeRules?.[0]?.reason).toContain("no per-window order series");
  });
});

describe("IEEE Std 519-2014 voltage (§5.1 and Table 1 statistics — from memory): daily p99 of 3 s < 1.5 ×, weekly p95 of 10 min < 1.0 ×", () => {
  test("a 12-minute 230 V record with h5 at 4 % of nominal passes both; h7 at 5.5 % fails the 10-minute p95 (limit 5 %)", () => {
    const analysis = makeSeriesAnalysis(3600, [{ name: "Va", quantity: "voltage", fundamental: 230, orders: { 5: () => 9.2, 7: () => 12.65 } }]);
    const result = run("ieee-519-2014-voltage", analysis, { busVoltageV: 400, nominalVoltageV: 230 });
    expect(row(result, 5)).toMatchObject({ verdict: "pass" });
    expect(row(result, 7)).toMatchObject({ verdict: "fail", decidedBy: "weekly-p95-short" });
    expect(row(result, 7).measured).toBeCloseTo(5.5, 9);
    expect(rule(row(result, 7), "daily-p99-very-short")).toMatchObject({ verdict: "pass", limit: 7.5 });
  });
});
