// The "Mitigation study — prediction" page of the sheet PDF.
import { expect, test } from "vitest";
import { getSeedLimitSet } from "@/lib/compliance/seed";
import { FAMILY_MODELS } from "@/lib/frontends/families";
import { buildWhatIfReport } from "@/lib/mitigation/build-what-if-report";
import { buildSheetPdf } from "@/lib/reports/build-sheet-pdf";
import { formatNumber, verdictLabel } from "@/lib/reports/format";
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
  const study = { title: "Reactor on the drive", modelVersion: "frontends-1", result, createdAt: new Date("2026-03-03T00:00:00Z"), authorName: "Eve Engineer", evaluationCreatedAt: new Date("2026-03-02T10:01:00Z") };
  const text = pdfText(await buildSheetPdf(sheet, { compress: false, studies: [study] }));
  expect(text).toContain("Mitigation study");
  expect(text).toContain("prediction");
  expect(text).toContain("Reactor on the drive");
  expect(text).toContain("5 % AC line reactor");
  expect(text).toContain(`Predicted verdict: ${verdictLabel(result.compliance!.verdict).toUpperCase()}`);
  expect(text).toContain("model prediction");
  // The study says which evaluation it started from, and names the limit set, not its internal key.
  expect(text).toContain("Starts from the evaluation of 2026-03-02 10:01 UTC");
  expect(text).not.toContain("ieee-519-2014-current");
  // One unit per column: the table limit in amperes and, in a column of its own, in %IL. IEEE Std 519-2014
  // Table 2, 20 ≤ Isc/IL < 50 (Isc/IL = 5000/150 = 33.3): 7.0 % for 3 ≤ h < 11 and 3.5 % for 11 ≤ h < 17;
  // × IL = 150 A gives 10.5 A and 5.25 A.
  expect(text).toContain("Measured (A)\nPredicted (A)\nTable limit (A)\nTable limit (%IL)\nPredicted verdict");
  // Three significant figures, as the "try a fix" table shows them; each row's measured and predicted current
  // and its predicted verdict are the study's own (what the PDF is given, printed as it is).
  const channel = result.channels[0]!;
  const judged = result.compliance!.channels[0]!.rows;
  const line = (h: number, limitA: string, limitPercent: string) => {
    const harmonic = channel.harmonics.find((x) => x.order === h)!;
    const verdict = verdictLabel(judged.find((r) => r.order === h)!.verdict);
    return `\n${h}\n${formatNumber(harmonic.measuredRms, 3)}\n${formatNumber(harmonic.rms, 3)}\n${limitA}\n${limitPercent}\n${verdict}\n`;
  };
  expect(text).toContain(line(5, "10.5", "7"));
  expect(text).toContain(line(11, "5.25", "3.5"));
}, 30_000);
