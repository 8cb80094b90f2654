import { describe, expect, test } from "vitest";
import { decimateSeries } from "@/lib/reports/decimate-series";
import type { RuleStatistic } from "@/lib/compliance/result";
import { causeText, statisticText } from "@/lib/reports/result-wording";
import { decidedByLabel, describeTimeBasis, formatPercentOfLimit, formatRuleLimit, formatRulePercentOfLimit, shortRuleLabel, tableLimitIfDifferent, timeRuleLines } from "@/lib/reports/time-rules";
import { makeSheet } from "./make-sheet";

describe("time-rule wording", () => {
  // Rules as the seed sets define them (IEC 61000-3-2 clause 6.2 smoothing, 150 %; IEEE Std 519-2014
  // §5.2 daily p99 of 3 s values ×2 for currents, weekly p95 of 10 min values).
  test.each<[RuleStatistic, number, string, string]>([
    [{ kind: "mean", intervalS: 1.5 }, 1, "mean 1.5 s smoothed", "average of 1.5 s smoothed values over the observation period"],
    [{ kind: "max", intervalS: 1.5 }, 1.5, "max 1.5 s smoothed ×1.5", "maximum of 1.5 s smoothed values over the observation period"],
    [{ kind: "percentile", percentile: 99, intervalS: 3, accumulationS: 86_400 }, 2, "p99 3 s / 24 h ×2", "99th percentile (nearest rank) of 3 s values per 24 h period (worst period)"],
    [{ kind: "percentile", percentile: 95, intervalS: 600, accumulationS: 604_800 }, 1, "p95 10 min / 7 days", "95th percentile (nearest rank) of 10 min values per 7-day period (worst period)"],
    [{ kind: "mean", intervalS: 0 }, 1, "mean window", "average of 10/12-cycle window values over the observation period"],
  ])("%o ×%d → %s", (measures, multiplier, short, long) => {
    expect(shortRuleLabel({ rule: "r", measures, multiplier, label: "Rule" })).toBe(short);
    expect(statisticText(measures)).toBe(long);
  });

  test("capture mean and threshold deciders have fixed names; a result stored without typed fields shows its label", () => {
    expect(shortRuleLabel(undefined, "snapshot")).toBe("capture mean");
    expect(shortRuleLabel(undefined, "threshold")).toBe("threshold");
    expect(shortRuleLabel({ rule: "x", multiplier: 1, label: "Custom rule" })).toBe("Custom rule");
  });

  test("not-evaluated causes read as sentences with their numbers", () => {
    expect(causeText({ code: "record-too-short", minimumS: 600, durationS: 120 })).toBe("needs at least 10 min of record; the record has 2 min");
    expect(causeText({ code: "missing-input", input: "ilA" })).toBe("IL (maximum demand load current at the PCC) not given");
    expect(causeText({ code: "above-nyquist", maxResolvableOrder: 25 })).toBe("above Nyquist (highest resolvable order 25)");
  });

  test("a limit shows its table limit and multiplier, or the allowance that raised it", () => {
    expect(formatRuleLimit({ limit: 1.155, tableLimit: 0.77, multiplier: 1.5 })).toBe("1.155 (0.77 ×1.5)");
    expect(formatRuleLimit({ limit: 2.3, tableLimit: 2.3, multiplier: 1 })).toBe("2.3");
    // POHC allowance: 1.5 × the limit for odd 21–39 (IEC 61000-3-2 clause 6.2, from memory).
    expect(formatRuleLimit({ limit: 0.1607, tableLimit: 0.1071, multiplier: 1 })).toBe("0.1607 (0.1071 with an allowance)");
  });
});

describe("% of limit: against the table limit, with enough digits to explain the verdict", () => {
  test("at the limit but failing: 0.450008855 A against 0.45 A reads 'over the limit by 0.002 %' (arithmetic: 8.855e-6 / 0.45 = 0.00197 %)", () => {
    const row = { measured: 0.450008855, limit: 0.45, percentOfLimit: (0.450008855 / 0.45) * 100, verdict: "fail" };
    expect(formatPercentOfLimit(row)).toBe("100.0 % — over the limit by 0.002 %");
    expect(formatPercentOfLimit(row, { compact: true })).toBe("100.002 %");
    expect(formatPercentOfLimit({ ...row, measured: 0.45, percentOfLimit: 100, verdict: "pass" })).toBe("100.0 %");
  });

  test("just under the limit and passing: 0.9996 %IL against 1 %IL reads 99.96 %, not 100.0 % (arithmetic)", () => {
    const row = { measured: 0.9996, limit: 1, percentOfLimit: 99.96, verdict: "pass" };
    expect(formatPercentOfLimit(row, { standalone: true })).toBe("99.96 % of the limit");
    expect(formatPercentOfLimit({ ...row, measured: 0.9, percentOfLimit: 90 })).toBe("90.0 %");
  });

  test("a rule with a multiplier: 3.54 A smoothed maximum against 1.5 × 2.3 A (IEC 61000-3-2 Table 1 h3, clause 6.2) reads 153.9 % of the table limit — rule allows 150 %", () => {
    const rule = { rule: "smoothed-max", label: "max", measured: 3.54, limit: 3.45, tableLimit: 2.3, multiplier: 1.5, unit: "A", percentOfLimit: (3.54 / 3.45) * 100, verdict: "fail" as const };
    const row = { measured: 3.54, limit: 3.45, percentOfLimit: rule.percentOfLimit, verdict: "fail", decidedBy: "smoothed-max", rowRules: [rule] };
    expect(formatPercentOfLimit(row)).toBe("153.9 % of the table limit — rule allows 150 %");
    expect(formatPercentOfLimit(row, { compact: true })).toBe("153.9 %");
    // The phone card and each rule's line in the table read the same, never 3.54 / 3.45 = 102.6 %.
    expect(formatPercentOfLimit(row, { standalone: true })).toBe("153.9 % of the table limit — rule allows 150 %");
    expect(formatRulePercentOfLimit(rule)).toBe("153.9 % of the table limit — rule allows 150 %");
  });

  test("standalone text (phone cards) names the limit; an at-the-limit fail keeps its excess in words", () => {
    // Arithmetic: 1.0 / 1.14 = 87.72 % (IEC 61000-3-2 Table 1 h5 limit 1.14 A).
    expect(formatPercentOfLimit({ measured: 1.0, limit: 1.14, percentOfLimit: (1.0 / 1.14) * 100, verdict: "pass" }, { standalone: true })).toBe("87.7 % of the limit");
    const atLimit = { measured: 0.450008855, limit: 0.45, percentOfLimit: (0.450008855 / 0.45) * 100, verdict: "fail" };
    expect(formatPercentOfLimit(atLimit, { standalone: true })).toBe("100.0 % of the limit — over the limit by 0.002 %");
    expect(formatPercentOfLimit({ measured: null, limit: 0.45, percentOfLimit: null, verdict: "not-evaluated" }, { standalone: true })).toBe("—");
  });
});

describe("rows decided by time rules (IEC 61000-3-2 Class A Table 1, clause 6.2)", () => {
  const sheet = makeSheet("iec-61000-3-2-class-a", { channels: [{ name: "I (A)", fundamentalRms: 8, harmonics: { 3: 2.5, 5: 1.0, 7: 0.33 } }] }, {}, {
    "I (A)": { 3: Array(10).fill(2.5), 7: [...Array(9).fill(0.3), 3.0] },
  });
  const result = sheet.evaluation!.result;
  const row = (h: number) => result.rows.find((r) => r.order === h)!;

  test("decided-by and table limit where it differs from the applied limit", () => {
    expect(decidedByLabel(row(3))).toBe("mean 1.5 s smoothed");
    expect(tableLimitIfDifferent(row(3))).toBeNull();
    expect(decidedByLabel(row(7))).toBe("max 1.5 s smoothed ×1.5");
    expect(tableLimitIfDifferent(row(7))).toBeCloseTo(0.77, 12);
    expect(decidedByLabel(row(9))).toBe("threshold");
  });

  test("the panel lines carry the statistic, values and accumulation of each rule", () => {
    const lines = timeRuleLines(result.timeRules, result.rows, result.aggregates);
    expect(lines.map((l) => [l.rule, l.status, l.interval, l.period, l.valueCount])).toEqual([
      ["smoothed-average", "applied", "1.5 s smoothed", "whole record", 10],
      ["smoothed-max", "applied", "1.5 s smoothed", "whole record", 10],
    ]);
    expect(describeTimeBasis(result.timeBasis!)).toEqual([
      ["Record", "2 s of 10/12-cycle analysis windows"],
      ["Values", "10 × 0.2 s"],
      ["Coverage", "every time rule applied; where a rule cannot be evaluated the capture r.m.s. mean is compared with 1.0 × the limit"],
    ]);
  });
});

describe("decimateSeries", () => {
  test("keeps every window when there are few, and smooths over all of them", () => {
    const d = decimateSeries([[10, 10, 10], [1, 1, 1]], [2], 0.2);
    expect(d.windowsPerPoint).toBe(1);
    expect(d.orders[0]!.rms).toEqual([1, 1, 1]);
    expect(d.orders[0]!.smoothed).toEqual([1, 1, 1]); // first-value start: a steady input stays steady
    expect(d.fundamental).toEqual([10, 10, 10]);
  });

  test("groups long series to at most maxPoints, keeping the largest value of each group (common practice for envelopes)", () => {
    const n = 1300;
    const h3 = Array.from({ length: n }, (_, k) => (k === 777 ? 5 : 1));
    const d = decimateSeries([Array(n).fill(10), null, h3], [3, 5], 0.2, 600);
    expect(d.windowsPerPoint).toBe(3);
    expect(d.orders.map((o) => o.order)).toEqual([3]); // order 5 has no series
    expect(d.orders[0]!.rms.length).toBe(Math.ceil(n / 3));
    expect(Math.max(...d.orders[0]!.rms)).toBe(5);
    expect(d.windowCount).toBe(n);
  });
});
