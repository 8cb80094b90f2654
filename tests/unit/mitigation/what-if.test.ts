// Mitigation what-ifs end to end on a synthetic six-pulse drive, and the CLI spec parser.
import { describe, expect, test } from "vitest";
import { getSeedLimitSet } from "@/lib/compliance/seed";
import { FAMILY_MODELS } from "@/lib/frontends/families";
import { buildWhatIfReport, WHAT_IF_CAUTION } from "@/lib/mitigation/build-what-if-report";
import { parseMitigationSpec } from "@/lib/mitigation/parse-mitigation-spec";
import { passiveFilterAtPcc } from "@/lib/mitigation/passive-filter-at-pcc";
import { syntheticAnalysis } from "../frontends/synthetic-analysis";

describe("parseMitigationSpec", () => {
  test.each([
    ["reactor=3%", { kind: "reactor", percent: 3 }],
    ["dc-choke=4%", { kind: "dc-choke", percent: 4 }],
    ["pulses=12", { kind: "multi-pulse", pulses: 12, imbalancePercent: 2 }],
    ["pulses=18,imbalance=1%", { kind: "multi-pulse", pulses: 18, imbalancePercent: 1 }],
    ["filter=4.7@300kvar", { kind: "passive-filter", tuningOrder: 4.7, kvar: 300, q: 30 }],
    ["filter=4.7@300kvar,q=50", { kind: "passive-filter", tuningOrder: 4.7, kvar: 300, q: 50 }],
    ["active=100A", { kind: "active-filter", ratingA: 100, fromOrder: 2, toOrder: 50 }],
    ["active=60A,orders=2-25", { kind: "active-filter", ratingA: 60, fromOrder: 2, toOrder: 25 }],
  ])("%s", (spec, expected) => {
    expect(parseMitigationSpec(spec)).toEqual(expected);
  });
  test.each([
    ["reactor", /expected KIND=VALUE/],
    ["reactor=x%", /reactor impedance "x" is not a number/],
    ["pulses=24", /pulses must be 12 or 18/],
    ["filter=4.7", /expected filter=ORDER@KVARkvar/],
    ["filter=4.7@300kvar,z=3", /unknown option "z"/],
    ["active=100", /expected active=RATINGA/],
    ["wings=2", /unknown kind "wings"/],
  ])("%s is refused with a message naming the problem", (spec, message) => {
    expect(() => parseMitigationSpec(spec)).toThrow(message);
  });
});

describe("buildWhatIfReport", () => {
  const set = getSeedLimitSet("ieee-519-2014-current")!;
  const limitSet = { key: set.key, name: set.name, revision: { id: "r1", number: 1 }, content: set.content };
  // A drive of 100 A fundamental on a 480 V bus with Isc = 5 kA and IL = 150 A (Isc/IL 33: 7 % per order below the 11th, TDD 8 % — IEEE Std 519-2014 Table 2, row 20 ≤ Isc/IL < 50).
  const context = { iscA: 5000, ilA: 150, busVoltageV: 480 };
  const drive = FAMILY_MODELS["six-pulse-capacitor"].exact({ acInductancePercent: 0.5, dcChokePercent: 0 });
  const analysis = syntheticAnalysis(drive, { noise: 0.01, seed: 3 });

  test("a 5 % reactor lowers the 5th and THD, re-judged against the same revision and context", () => {
    const r = buildWhatIfReport({ analysis, mitigations: [{ kind: "reactor", percent: 5 }], compliance: { limitSet, context } });
    const ch = r.channels[0]!;
    expect(r.prediction).toBe(true);
    expect(ch.frontEnd.family).toBe("six-pulse-capacitor");
    const h5 = ch.harmonics.find((h) => h.order === 5)!;
    expect(h5.rms!).toBeLessThan(h5.measuredRms! * 0.6);
    expect(ch.thdPercent).toBeLessThan(ch.measuredThdPercent * 0.5);
    // 5.5 % total reactance: between the 3 % and 5 % rows of common practice, no source (THD 30–45 %), ±30 %.
    expect(ch.thdPercent).toBeGreaterThan(30 * 0.7);
    expect(ch.thdPercent).toBeLessThan(45 * 1.3);
    expect(ch.tddPercent).toBeCloseTo((ch.thdPercent * 100) / 150, 6);
    expect(r.compliance!.limitSet.key).toBe("ieee-519-2014-current");
    expect(r.compliance!.revision).toEqual({ id: "r1", number: 1 });
    expect(r.compliance!.context).toMatchObject(context);
    expect(r.caution).toBe(WHAT_IF_CAUTION);
    expect(r.caution).toMatch(/model prediction/);
  });

  test("a 4.7th filter: the 5th into the supply is the load's 5th times the divider share", () => {
    const r = buildWhatIfReport({ analysis, mitigations: [{ kind: "passive-filter", tuningOrder: 4.7, kvar: 150, q: 30 }], compliance: { limitSet, context } });
    const ch = r.channels[0]!;
    const share = passiveFilterAtPcc({ tuningOrder: 4.7, kvar: 150, q: 30, busVoltageV: 480, iscA: 5000, xOverR: 10 }).supplyShare(5);
    const h5 = ch.harmonics.find((h) => h.order === 5)!;
    expect(h5.rms!).toBeCloseTo(h5.measuredRms! * share, 6);
    expect(ch.filters[0]!.kind).toBe("passive-filter");
    expect(ch.filters[0]!.parallelResonanceOrder!).toBeLessThan(4.7);
    expect(r.assumptions.join(" ")).toMatch(/X\/R = 10 \(default\)/);
  });

  test("an active filter's residual and rating used", () => {
    const r = buildWhatIfReport({ analysis, mitigations: [{ kind: "active-filter", ratingA: 1000, fromOrder: 2, toOrder: 50 }] });
    const ch = r.channels[0]!;
    for (const h of ch.harmonics.filter((x) => x.order > 1)) expect(h.rms).toBe(0);
    expect(ch.thdPercent).toBe(0);
    // Rating used = the r.s.s. of the measured harmonics = THD × I1.
    expect(ch.filters[0]!.ratingUsedA!).toBeCloseTo((ch.measuredThdPercent / 100) * 100, 6);
    expect(r.compliance).toBeNull();
  });

  test("a filter without Isc or bus voltage is refused naming the missing input", () => {
    expect(() => buildWhatIfReport({ analysis, mitigations: [{ kind: "passive-filter", tuningOrder: 4.7, kvar: 150, q: 30 }] })).toThrow(/short-circuit current at the PCC/);
    expect(() => buildWhatIfReport({ analysis, mitigations: [{ kind: "passive-filter", tuningOrder: 4.7, kvar: 150, q: 30 }], network: { iscA: 5000 } })).toThrow(/bus voltage/);
  });

  test("twelve pulses from the fitted six-pulse drive remove most of the 5th and 7th", () => {
    const r = buildWhatIfReport({ analysis, mitigations: [{ kind: "multi-pulse", pulses: 12, imbalancePercent: 2 }] });
    const ch = r.channels[0]!;
    const h5 = ch.harmonics.find((h) => h.order === 5)!;
    // 2 % imbalance leaves ε = 1 % of the six-pulse 5th (see the multi-pulse model test).
    expect(h5.rms! / h5.measuredRms!).toBeCloseTo(0.01, 3);
  });

  test("a reactor on a family it does not apply to is left out with a warning", () => {
    const afe = syntheticAnalysis(FAMILY_MODELS["active-front-end"].exact({ lowOrderResidualPercent: 3, switchingOrder: 40, sidebandPercent: 2 }));
    const r = buildWhatIfReport({ analysis: afe, mitigations: [{ kind: "reactor", percent: 3 }] });
    expect(r.warnings.join(" ")).toMatch(/not modelled for a active-front-end front end/);
    expect(r.channels[0]!.thdPercent).toBeCloseTo(r.channels[0]!.measuredThdPercent, 9);
  });
});
