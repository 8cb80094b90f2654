// The CLI contract of --diagnose and --mitigate (lib side; the flags are wired in scripts/analyze.ts).
import { expect, test } from "vitest";
import { getSeedLimitSet } from "@/lib/compliance/seed";
import { FAMILY_MODELS } from "@/lib/frontends/families";
import { buildCliAdditions } from "@/lib/mitigation/build-cli-additions";
import { syntheticAnalysis } from "../frontends/synthetic-analysis";

const analysis = syntheticAnalysis(FAMILY_MODELS["six-pulse-capacitor"].exact({ acInductancePercent: 1, dcChokePercent: 0 }), { noise: 0.01, seed: 5 });

test("--diagnose: channels with candidates best first, each family once", () => {
  const out = buildCliAdditions(analysis, { diagnose: true });
  expect(out.whatIf).toBeUndefined();
  const ch = out.diagnosis!.channels[0]!;
  expect(ch.name).toBe("Ia");
  expect(ch.candidates[0]!.family).toBe("six-pulse-capacitor");
  expect(new Set(ch.candidates.map((c) => c.family)).size).toBe(ch.candidates.length);
  const errors = ch.candidates.map((c) => c.fitErrorPercent);
  expect(errors).toEqual([...errors].sort((x, y) => x - y));
  for (const c of ch.candidates) {
    expect(Object.keys(c).sort()).toEqual(["description", "family", "fitErrorPercent", "parameters"]);
  }
}, 30_000);

test("--mitigate in order, with compliance of the measured shape when limits are given", () => {
  const set = getSeedLimitSet("ieee-519-2014-current")!;
  const out = buildCliAdditions(analysis, {
    mitigate: ["reactor=3%", "filter=4.7@150kvar,q=40"],
    compliance: { limitSet: { key: set.key, name: set.name, revision: { id: `seed:${set.key}`, number: 1 }, content: set.content }, context: { iscA: 5000, ilA: 150, busVoltageV: 480 } },
  });
  expect(out.diagnosis).toBeUndefined();
  expect(out.whatIf!.mitigations.map((m) => m.kind)).toEqual(["reactor", "passive-filter"]);
  expect(out.whatIf!.channels[0]!.harmonics[0]).toEqual({ order: 1, rms: 100 });
  expect(out.whatIf!.compliance!.limitSet.key).toBe("ieee-519-2014-current");
  expect(out.whatIf!.channels[0]!.tddPercent).not.toBeNull();
}, 30_000);

test("a filter without Isc is an error naming it; a bad spec names the spec", () => {
  expect(() => buildCliAdditions(analysis, { mitigate: ["filter=4.7@300kvar"] })).toThrow(/--isc/);
  expect(() => buildCliAdditions(analysis, { mitigate: ["reactor=lots"] })).toThrow('mitigation "reactor=lots"');
});
