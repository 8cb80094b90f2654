// Time rules are limit-set data: validated by zod like the tables, filled in the seed sets.
import { describe, expect, test } from "vitest";
import { LimitSetRevisionContentSchema, TimeRuleSchema } from "@/lib/compliance/model";
import { getSeedLimitSet } from "@/lib/compliance/seed";

const base = { id: "r", label: "Rule", statistic: "max", intervalS: 1.5, multiplier: 1.5 } as const;

describe("TimeRuleSchema", () => {
  test("defaults: minimum duration 0, applies to all", () => {
    expect(TimeRuleSchema.parse(base)).toMatchObject({ minimumDurationS: 0, appliesTo: "all" });
  });

  test.each([
    [{ ...base, statistic: "percentile" }, "a percentile time rule needs `percentile`"],
    [{ ...base, percentile: 95 }, "only a percentile rule may have one"],
    [{ ...base, intervalS: 60 }, "Invalid"],
    [{ ...base, id: "Not Kebab" }, "time rule id must be kebab-case"],
    [
      { ...base, statistic: "mean", relaxation: { enabled: true, multiplier: 2, maxExcursionFraction: 0.1, maxExcursionS: 600, averageBelowFraction: 0.9, source: "s" } },
      "only a max time rule may have a relaxation",
    ],
  ])("rejects %j", (rule, message) => {
    const parsed = TimeRuleSchema.safeParse(rule);
    expect(parsed.success).toBe(false);
    expect(JSON.stringify(parsed.error?.issues)).toContain(message);
  });

  test("a revision rejects duplicate rule ids and a POHC-allowance rule without rules.pohcAllowance", () => {
    const content = structuredClone(getSeedLimitSet("iec-61000-3-2-class-c")!.content);
    content.rules.timeRules = [...content.rules.timeRules!, { ...content.rules.timeRules![0]!, pohcAllowance: true }];
    const messages = LimitSetRevisionContentSchema.safeParse(content).error?.issues.map((issue) => issue.message);
    expect(messages).toContain('duplicate time rule id "smoothed-average"');
    expect(messages).toContain('time rule "smoothed-average" uses the POHC allowance but rules.pohcAllowance is not set');
  });
});

describe("seed time rules", () => {
  test.each([
    ["iec-61000-3-2-class-a", [["smoothed-average", "mean", 1.5, 1], ["smoothed-max", "max", 1.5, 1.5]]],
    ["iec-61000-3-12", [["smoothed-average", "mean", 1.5, 1], ["smoothed-max", "max", 1.5, 1.5]]],
    [
      "ieee-519-2014-current",
      [["daily-p99-very-short", "percentile", 3, 2], ["weekly-p99-short", "percentile", 600, 1.5], ["weekly-p95-short", "percentile", 600, 1]],
    ],
    ["ieee-519-2014-voltage", [["daily-p99-very-short", "percentile", 3, 1.5], ["weekly-p95-short", "percentile", 600, 1]]],
  ])("%s (IEC 61000-3-2:2018+A1:2020 clause 6.2 and IEC 61000-3-12:2011 time aspects as IEC 61000-3-2, 1.5 s smoothing per IEC 61000-4-7:2002+A1:2008 §5.5.1; IEEE Std 519-2014 §5.1–5.2 statistics — from memory)", (key, expected) => {
    const rules = getSeedLimitSet(key)!.content.rules.timeRules!;
    expect(rules.map((rule) => [rule.id, rule.statistic, rule.intervalS, rule.multiplier])).toEqual(expected);
    // Each rule cites its own standard and edition (the set's key names it), worded as in the tests.
    const standard = key.startsWith("ieee-519") ? /^IEEE Std 519-2014 / : key.startsWith("iec-61000-3-12") ? /^IEC 61000-3-12:2011 / : /^IEC 61000-3-2:2018\+A1:2020 /;
    for (const rule of rules) expect(rule.source).toMatch(standard);
  });

  test("the Class A 200 % relaxation is present as data and disabled (from memory); Class B has none", () => {
    const classA = getSeedLimitSet("iec-61000-3-2-class-a")!.content.rules.timeRules!.find((rule) => rule.id === "smoothed-max")!;
    expect(classA.relaxation).toMatchObject({ enabled: false, multiplier: 2, maxExcursionFraction: 0.1, maxExcursionS: 600, averageBelowFraction: 0.9 });
    expect(getSeedLimitSet("iec-61000-3-2-class-b")!.content.rules.timeRules!.find((rule) => rule.id === "smoothed-max")!.relaxation).toBeUndefined();
  });

  test("IEEE Std 519-2014 §5.2 percentile rules: nearest rank, '<' (passAtLimit false), daily / weekly accumulation, minimum one value", () => {
    const rules = getSeedLimitSet("ieee-519-2014-current")!.content.rules.timeRules!;
    expect(rules.map((rule) => [rule.percentile, rule.accumulationS, rule.minimumDurationS, rule.passAtLimit])).toEqual([
      [99, 86_400, 3, false],
      [99, 604_800, 600, false],
      [95, 604_800, 600, false],
    ]);
  });
});
