// The limits line of a sheet (wording fixed by the product issue: verified, or a visible warning).
import { describe, expect, test } from "vitest";
import { buildSheetPdf } from "@/lib/reports/build-sheet-pdf";
import { limitsLine } from "@/lib/reports/limits-line";
import { makeSheet } from "./make-sheet";
import { pdfText } from "./pdf-text";

const verification = { edition: "IEC 61000-3-2:2018", checked: "Table 1", verifiedByName: "Ines Marlowe", verifiedOn: "2026-12-03" };

describe("limitsLine", () => {
  test("a verified revision names the edition, table, revision, verifier (initial and surname) and date", () => {
    const line = limitsLine({ standard: "IEC 61000-3-2", edition: "Edition 5.0 (2018)", revisionNumber: 3, verification });
    expect(line).toEqual({
      verified: true,
      text: "Limits: IEC 61000-3-2:2018 Table 1, revision 3, verified against the printed edition by I. Marlowe on 2026-12-03",
    });
  });

  test("an unverified revision says so and asks for a check", () => {
    const line = limitsLine({ standard: "IEEE 519", edition: "2014", revisionNumber: 1, verification: null });
    expect(line.verified).toBe(false);
    expect(line.text).toBe(
      "Limits: IEEE 519, 2014, revision 1 — not yet verified against the printed standard. Check the limit values against your copy of the standard before relying on this sheet.",
    );
  });

  test("the PDF prints the line on page 1, verified or not", async () => {
    const sheet = makeSheet("iec-61000-3-2-class-a", { channels: [{ name: "I (A)", fundamentalRms: 8, harmonics: { 3: 2.5 } }] });
    // Long lines wrap in the PDF: rejoin its text lines with spaces.
    const flat = (pdf: Buffer) => pdfText(pdf).replace(/\s*\n\s*/g, " ");
    const unverified = flat(await buildSheetPdf(sheet, { compress: false, generatedAt: new Date("2026-03-03T00:00:00Z") }));
    expect(unverified).toContain("not yet verified against the printed standard");
    const verified = flat(await buildSheetPdf({ ...sheet, limitsVerification: verification }, { compress: false, generatedAt: new Date("2026-03-03T00:00:00Z") }));
    expect(verified).toContain("verified against the printed edition by I. Marlowe on 2026-12-03");
    expect(verified).not.toContain("not yet verified");
  });
});
