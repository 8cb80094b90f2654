// Declared (rated) power against measured active power for IEC 61000-3-2 Class C and D:
// the declared value is used only within ±10 % of the measured one (IEC 61000-3-2:2018+A1:2020
// clause 6.2 — from memory).
import { describe, expect, test } from "vitest";
import type { AnalysisResult } from "@/lib/analysis/types";
import { judgeWithSeed } from "@/tests/support/judge-with-seed";
import { formatComplianceTable } from "@/lib/compliance/format-compliance-table";
import { choosePower } from "@/lib/compliance/declared-power";
import type { EvaluationContext } from "@/lib/compliance/model";
import { buildSheetCsv } from "@/lib/reports/build-sheet-csv";
import { powerChoiceText } from "@/lib/reports/result-wording";
import { makeAnalysis } from "./make-analysis";
import { makeSheet } from "../reports/make-sheet";

/** One V–I pair drawing `measuredW` of active power (unity power factor for simplicity). */
function powerOf(measuredW: number): AnalysisResult["power"] {
  return {
    phases: [
      { voltage: "U", current: "I", activePowerW: measuredW, apparentPowerVA: measuredW, displacementFactor: 1, distortionFactor: 1, truePowerFactor: 1 },
    ],
    total: null,
  };
}

function classD(h3A: number, measuredW: number | null, context: EvaluationContext) {
  const analysis = makeAnalysis({
    channels: [{ name: "I", fundamentalRms: 1.3, harmonics: { 3: h3A } }],
    ...(measuredW !== null ? { power: powerOf(measuredW) } : {}),
  });
  return judgeWithSeed(analysis, "iec-61000-3-2-class-d", context);
}

describe("choosePower: the ±10 % boundary (300 W measured)", () => {
  test.each([
    [330, 330, "declared-within-tolerance"], // +10 % exactly: inside
    [331, 300, "measured-declared-outside-tolerance"], // +10.33 %: outside
    [270, 270, "declared-within-tolerance"], // −10 % exactly: inside
    [269, 300, "measured-declared-outside-tolerance"], // −10.33 %: outside
    [300, 300, "declared-within-tolerance"],
  ])("declared %d W → limits use %d W (%s)", (declaredW, usedW, rule) => {
    expect(choosePower(declaredW, 300)).toMatchObject({ declaredW, measuredW: 300, usedW, rule });
  });

  test("without a measurement the declared value is used; without a declaration the measured one", () => {
    expect(choosePower(600, null)).toMatchObject({ usedW: 600, rule: "declared-not-measured" });
    expect(choosePower(undefined, 300)).toMatchObject({ usedW: 300, rule: "measured-no-declaration" });
    expect(choosePower(undefined, null)).toMatchObject({ usedW: null, rule: "none" });
  });
});

describe("Class D h3 limit = 3.4 mA/W × the power used (IEC 61000-3-2:2018+A1:2020 Table 3)", () => {
  test("measured 300 W, declared 600 W: h3 limit 3.4 × 300 / 1000 = 1.02 A, not 2.04 A — 1.5 A fails", () => {
    const result = classD(1.5, 300, { ratedPowerW: 600 });
    const h3 = result.rows.find((row) => row.order === 3)!;
    expect(h3.limit).toBeCloseTo(1.02, 10);
    expect(h3.verdict).toBe("fail");
    expect(result.verdict).toBe("fail");
    expect(result.power).toMatchObject({ declaredW: 600, measuredW: 300, usedW: 300, rule: "measured-declared-outside-tolerance", deviationPercent: 100 });
    expect(result.channels[0]!.power).toEqual(result.power);
  });

  test.each([
    [330, 1.122], // 3.4 × 330 / 1000
    [331, 1.02], // 3.4 × 300 / 1000
    [270, 0.918], // 3.4 × 270 / 1000
    [269, 1.02],
  ])("measured 300 W, declared %d W → h3 limit %d A", (declaredW, limitA) => {
    const h3 = classD(0.5, 300, { ratedPowerW: declaredW }).rows.find((row) => row.order === 3)!;
    expect(h3.limit).toBeCloseTo(limitA, 10);
  });

  test("the measured power also chooses the band: declared 600 W but 60 W measured → the P ≤ 75 W band, no limits (clause 7)", () => {
    const result = classD(0.5, 60, { ratedPowerW: 600 });
    expect(result.band.label).toBe("Class D, P ≤ 75 W (no limits)");
    expect(result.verdict).toBe("pass");
  });

  test("no voltage recorded: the declared value is used and the sheet says the check could not be made", () => {
    const result = classD(0.5, null, { ratedPowerW: 200 });
    expect(result.rows.find((row) => row.order === 3)!.limit).toBeCloseTo(0.68, 10); // 3.4 × 200 / 1000
    expect(result.power?.rule).toBe("declared-not-measured");
  });

  test("Class A does not depend on rated power and carries no power choice", () => {
    const analysis = makeAnalysis({ channels: [{ name: "I", fundamentalRms: 8, harmonics: { 3: 1 } }], power: powerOf(1800) });
    expect(judgeWithSeed(analysis, "iec-61000-3-2-class-a", { ratedPowerW: 600 }).power).toBeUndefined();
  });
});

describe("the words, in the one wording place, on the CSV and the CLI table", () => {
  test("declared, measured, used and why", () => {
    expect(powerChoiceText(choosePower(600, 300))).toBe("declared 600 W differs from the measured 300 W by +100 % (more than ±10 %): the limits use the measured 300 W");
    expect(powerChoiceText(choosePower(330, 300))).toBe("declared 330 W is within ±10 % of the measured 300 W (+10 %): the limits use the declared 330 W");
  });

  test("the CSV header block and the CLI table carry the three powers", () => {
    const sheet = makeSheet("iec-61000-3-2-class-d", { channels: [{ name: "I", fundamentalRms: 1.3, harmonics: { 3: 1.5 } }], power: powerOf(300) }, { ratedPowerW: 600 });
    const csv = buildSheetCsv(sheet);
    expect(csv).toContain("Declared power,600 W\r\n");
    expect(csv).toContain("Measured active power,300 W\r\n");
    expect(csv).toContain("Power used for the limits,300 W — declared 600 W differs from the measured 300 W by +100 %");
    const analysis = makeAnalysis({ channels: [{ name: "I", fundamentalRms: 1.3, harmonics: { 3: 1.5 } }], power: powerOf(300) });
    expect(formatComplianceTable(judgeWithSeed(analysis, "iec-61000-3-2-class-d", { ratedPowerW: 600 }))).toContain("power used for the limits: 300 W");
  });
});
