// The "Mitigation study — prediction" page of the sheet PDF.
import { expect, test } from "vitest";
import { getSeedLimitSet } from "@/lib/compliance/seed";
import { FAMILY_MODELS } from "@/lib/frontends/families";
import { buildWhatIfReport } from "@/lib/mitigation/build-what-if-report";
import { buildSheetPdf } from "@/lib/reports/build-sheet-pdf";
import { syntheticAnalysis } from "../frontends/synthetic-analysis";
import { makeSheet } from "./make-sheet";
import { pdfText } from "./pdf-text";

test("a chosen study prints on its own page marked as a prediction, with verdict, orders and caution", async () => {
  const sheet = makeSheet("iec-61000-3-2-class-a", { channels: [{ name: "I (A)", fundamentalRms: 8, harmonics: { 3: 2.5, 5: 1.0, 7: 0.5 } }] });
  const set = getSeedLimitSet("ieee-519-2014-current")!;
  const analysis = syntheticAnalysis(FAMILY_MODELS["six-pulse-capacitor"].exact({ acInductancePercent: 0.5, dcChokePercent: 0 }));
  const result = buildWhatIfReport({
    analysis,
    mitigations: [{ kind: "reactor", percent: 5 }],
    compliance: { limitSet: { key: set.key, name: set.name, revision: { id: "r", number: 1 }, content: set.content }, context: { iscA: 5000, ilA: 150, busVoltageV: 480 } },
  });
  const without = pdfText(await buildSheetPdf(sheet, { compress: false }));
  expect(without).not.toContain("Mitigation study");
  const text = pdfText(await buildSheetPdf(sheet, { compress: false, studies: [{ title: "Reactor on the drive", modelVersion: "frontends-1", result, createdAt: new Date("2026-03-03T00:00:00Z"), authorName: "Eve Engineer" }] }));
  expect(text).toContain("Mitigation study");
  expect(text).toContain("prediction");
  expect(text).toContain("Reactor on the drive");
  expect(text).toContain("5 % AC line reactor");
  expect(text).toContain(`Predicted verdict: ${result.compliance!.verdict.toUpperCase()}`);
  expect(text).toContain("model prediction");
}, 30_000);
