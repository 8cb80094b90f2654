import { describe, expect, test } from "vitest";
import { buildSheetPdf } from "@/lib/reports/build-sheet-pdf";
import { makeSheet } from "./make-sheet";
import { pdfText } from "./pdf-text";

const single = makeSheet("iec-61000-3-2-class-a", {
  channels: [{ name: "I (A)", fundamentalRms: 8, harmonics: { 3: 2.5, 5: 1.0, 7: 0.5 } }],
});

describe("sheet PDF", () => {
  test("is a PDF whose text holds the summary, per-order table, revision and safety caution", async () => {
    const pdf = await buildSheetPdf(single, { compress: false, generatedAt: new Date("2026-03-03T00:00:00Z") });
    expect(pdf.subarray(0, 4).toString()).toBe("%PDF");
    const text = pdfText(pdf);
    expect(text).toContain("Bench B kettle, run 2");
    expect(text).toContain("Overall verdict: FAIL");
    expect(text).toContain("Revision 1");
    expect(text).toMatch(/IEC 61000-3-2/);
    // h3 row: 2.5 A against 2.3 A, 108.7 %, margin −0.2, Fail
    const lines = text.split("\n");
    const h3 = lines.indexOf("h3");
    expect(h3).toBeGreaterThan(0);
    expect(lines.slice(h3, h3 + 7)).toEqual(["h3", "2.5", "2.3", "A", "108.7 %", "-0.2", "Fail"]);
    expect(text).toContain("Below threshold");
    expect(text).toContain("qualified engineer");
    expect(text).toContain("Approved by Teodor Vance");
    expect(text).toContain("h3 excess confirmed");
    expect(text).toContain("page 1 of");
  });

  test("leaves review comments out when asked (share links)", async () => {
    const text = pdfText(await buildSheetPdf(single, { compress: false, includeComments: false }));
    expect(text).toContain("Approved by Teodor Vance");
    expect(text).not.toContain("h3 excess confirmed");
  });

  test("compressed output is still readable after inflating", async () => {
    const pdf = await buildSheetPdf(single);
    expect(pdf.subarray(0, 4).toString()).toBe("%PDF");
    expect(pdfText(pdf)).toContain("108.7 %");
  });

  test("a three-phase IEEE 519 sheet lists every channel and prints symbols the fonts lack in words", async () => {
    const sheet = makeSheet(
      "ieee-519-2014-current",
      {
        channels: ["a", "b", "c"].map((phase, i) => ({ name: `I${phase.toUpperCase()}`, phase, fundamentalRms: 250, harmonics: { 5: 10 + i, 7: 6, 11: 3 } })),
      },
      { iscA: 8200, ilA: 260, busVoltageV: 11000 },
    );
    const text = pdfText(await buildSheetPdf(sheet, { compress: false }));
    for (const name of ["IA", "IB", "IC"]) expect(text).toContain(`Channel ${name}:`);
    expect(text).toContain("Isc/IL");
    expect(text).toContain("31.5");
    expect(text).not.toMatch(/[λ≤]/);
  });
});
