// The diagnosis recovers the family and parameters of synthetic spectra made by each model with
// 1 % noise (seeded PRNG). The expected parameters are the ones the spectra were made with.
import { describe, expect, test } from "vitest";
import { diagnoseChannels } from "@/lib/frontends/diagnose-channels";
import { FAMILY_MODELS } from "@/lib/frontends/families";
import type { FrontEndFamily, FrontEndParameters } from "@/lib/frontends/types";
import { syntheticAnalysis } from "./synthetic-analysis";

interface Case {
  family: FrontEndFamily;
  parameters: FrontEndParameters;
  /** Checks of the fitted parameters. */
  check: (fitted: FrontEndParameters) => void;
}

const near = (actual: number | undefined, expected: number, tolerance: number): void => {
  expect(actual).toBeDefined();
  expect(Math.abs(actual! - expected)).toBeLessThanOrEqual(tolerance);
};

const cases: Case[] = [
  // The capacitor's current pulse depends on ωL relative to the load impedance, so line
  // inductance is judged on its ratio to the (unidentifiable) capacitor size only loosely.
  { family: "single-phase-capacitor", parameters: { lineInductancePercent: 2.5, capacitorPu: 18 }, check: (p) => near(p.lineInductancePercent, 2.5, 0.6) },
  {
    family: "six-pulse-capacitor",
    parameters: { acInductancePercent: 2.5, dcChokePercent: 0 },
    check: (p) => {
      near(p.acInductancePercent, 2.5, 0.3);
      near(p.dcChokePercent, 0, 0.5);
    },
  },
  {
    family: "six-pulse-capacitor",
    parameters: { acInductancePercent: 0.5, dcChokePercent: 4 },
    check: (p) => {
      near(p.acInductancePercent, 0.5, 0.3);
      near(p.dcChokePercent, 4, 0.8);
    },
  },
  { family: "six-pulse-inductor", parameters: { commutationReactancePercent: 6 }, check: (p) => near(p.commutationReactancePercent, 6, 0.3) },
  {
    family: "thyristor-bridge",
    parameters: { firingAngleDeg: 35, commutationReactancePercent: 6 },
    check: (p) => {
      near(p.firingAngleDeg, 35, 2);
      near(p.commutationReactancePercent, 6, 0.5);
    },
  },
  { family: "twelve-pulse", parameters: { commutationReactancePercent: 6, imbalancePercent: 4 }, check: (p) => (near(p.commutationReactancePercent, 6, 0.5), near(p.imbalancePercent, 4, 0.5)) },
  { family: "eighteen-pulse", parameters: { commutationReactancePercent: 6, imbalancePercent: 4 }, check: (p) => (near(p.commutationReactancePercent, 6, 0.8), near(p.imbalancePercent, 4, 0.5)) },
  { family: "symmetrical-angle", parameters: { conductionWidthDeg: 110 }, check: (p) => near(p.conductionWidthDeg, 110, 1) },
  {
    family: "active-front-end",
    parameters: { lowOrderResidualPercent: 3, switchingOrder: 40, sidebandPercent: 3 },
    check: (p) => (near(p.lowOrderResidualPercent, 3, 0.2), near(p.switchingOrder, 40, 0.5), near(p.sidebandPercent, 3, 0.2)),
  },
  { family: "linear", parameters: { displacementDeg: 20 }, check: (p) => near(p.displacementDeg, 20, 1) },
];

describe("diagnosis of synthetic spectra (1 % noise)", () => {
  test.each(cases)("$family: best candidate is the family, parameters recovered, fit within 2 %", ({ family, parameters, check }) => {
    const analysis = syntheticAnalysis(FAMILY_MODELS[family].exact(parameters), { noise: 0.01, seed: 42 });
    const diagnosis = diagnoseChannels(analysis);
    expect(diagnosis.channels).toHaveLength(1);
    const channel = diagnosis.channels[0]!;
    expect(channel.name).toBe("Ia");
    expect(channel.usedVoltage).toBe(true);
    expect(channel.candidates).toHaveLength(3);
    // The six-pulse-inductor is the thyristor bridge at α = 0: both fit, either may rank first.
    const best = channel.candidates[0]!;
    if (family === "six-pulse-inductor" && best.family === "thyristor-bridge") near(best.parameters.firingAngleDeg, 0, 1);
    else expect(best.family).toBe(family);
    check(channel.candidates.find((c) => c.family === family)!.parameters);
    expect(best.fitErrorPercent).toBeLessThan(2);
    expect(channel.fits).toBe(true);
    expect(channel.summary).toMatch(/^The spectrum resembles /);
    for (let k = 1; k < 3; k++) expect(channel.candidates[k]!.fitErrorPercent).toBeGreaterThanOrEqual(channel.candidates[k - 1]!.fitErrorPercent);
  });

  test("a six-pulse drive without a voltage channel is still recognised from magnitudes and shape", () => {
    const analysis = syntheticAnalysis(FAMILY_MODELS["six-pulse-capacitor"].exact({ acInductancePercent: 4, dcChokePercent: 0 }), { noise: 0.01, seed: 7, withVoltage: false });
    const channel = diagnoseChannels(analysis).channels[0]!;
    expect(channel.usedVoltage).toBe(false);
    expect(channel.candidates[0]!.family).toBe("six-pulse-capacitor");
  });

  test("a mix no family makes says no model fits within 5 %", () => {
    // Half a six-pulse drive, half single-phase electronics: strong 3rd AND strong 5th/7th.
    const six = FAMILY_MODELS["six-pulse-capacitor"].exact({ acInductancePercent: 0.5, dcChokePercent: 0 });
    const one = FAMILY_MODELS["single-phase-capacitor"].exact({ lineInductancePercent: 0.5, capacitorPu: 20 });
    const magnitude = new Float64Array(51);
    const phaseRad = new Float64Array(51);
    for (let h = 1; h <= 50; h++) {
      const re = six.magnitude[h]! * Math.cos(six.phaseRad[h]!) + one.magnitude[h]! * Math.cos(one.phaseRad[h]!);
      const im = six.magnitude[h]! * Math.sin(six.phaseRad[h]!) + one.magnitude[h]! * Math.sin(one.phaseRad[h]!);
      magnitude[h] = Math.hypot(re, im);
      phaseRad[h] = Math.atan2(im, re);
    }
    for (let h = 50; h >= 1; h--) magnitude[h] = magnitude[h]! / magnitude[1]!;
    const channel = diagnoseChannels(syntheticAnalysis({ magnitude, phaseRad })).channels[0]!;
    expect(channel.fits).toBe(false);
    expect(channel.summary).toMatch(/^No model fits within 5 %/);
    // The best family is named in words for people, not by its key (e.g. "thyristor-bridge").
    expect(channel.summary).not.toContain(`best: ${channel.candidates[0]!.family},`);
  });

  test("a named channel that is not a current channel is refused with its name", () => {
    const analysis = syntheticAnalysis(FAMILY_MODELS.linear.exact({ displacementDeg: 0 }));
    expect(() => diagnoseChannels(analysis, "Va")).toThrow('no current channel named "Va"');
  });
});
