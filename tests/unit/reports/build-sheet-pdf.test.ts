import { describe, expect, test } from "vitest";
import { buildSheetPdf } from "@/lib/reports/build-sheet-pdf";
import { makeSheet } from "./make-sheet";
import { pdfPageTexts, pdfText } from "./pdf-text";

const single = makeSheet("iec-61000-3-2-class-a", {
  channels: [{ name: "I (A)", fundamentalRms: 8, harmonics: { 3: 2.5, 5: 1.0, 7: 0.5 } }],
});

describe("sheet PDF", () => {
  test("the notes list the limit set's interpretation choices once, without provenance markers or internal names", async () => {
    const pdf = await buildSheetPdf(single, { compress: false, generatedAt: new Date("2026-03-03T00:00:00Z") });
    const flat = pdfText(pdf).replace(/\s+/g, " ");
    const phrase = "the average of the 1.5 s smoothed values is compared with the limit and each smoothed value with 150 % of it";
    expect(flat).toContain(phrase);
    expect(flat.split(phrase).length - 1).toBe(1);
    for (const marker of ["from memory", "(confirmed)", "Ordwise choice", "common practice", "snapshot", "smoothed-average", "smoothed-max", "rowRules"]) {
      expect(flat).not.toContain(marker);
    }
  });

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
    // columns: order, measured, limit, table limit, unit, % of limit, margin, verdict, decided by
    expect(lines.slice(h3, h3 + 9)).toEqual(["h3", "2.5", "2.3", "2.3", "A", "108.7 %", "-0.2", "Fail", "capture mean"]);
    expect(text).toContain("Table limit");
    expect(text).toContain("Decided by");
    // Without per-window series the smoothed rules cannot be applied; the PDF says why.
    expect(text).toContain("Time rules");
    expect(text).toMatch(/NOT EVALUATED: the\s+analysis\s+has\s+no\s+per-window\s+order\s+series/);
    expect(text).toContain("Below threshold");
    expect(text).toContain("qualified engineer");
    expect(text).toContain("Approved by Teodor Vance");
    expect(text).toContain("h3 excess confirmed");
    expect(text).toContain("page 1 of");
  });

  test("a time-rule-decided row prints its rule and the table limit under the multiplied one (IEC 61000-3-2 Table 1, clause 6.2)", async () => {
    const timed = makeSheet("iec-61000-3-2-class-a", { channels: [{ name: "I (A)", fundamentalRms: 8, harmonics: { 3: 2.5, 5: 1.0, 7: 0.33 } }] }, {}, {
      "I (A)": { 3: Array(10).fill(2.5), 7: [...Array(9).fill(0.3), 3.0] },
    });
    const lines = pdfText(await buildSheetPdf(timed, { compress: false })).split("\n");
    const h7 = lines.indexOf("h7");
    // 0.637 A smoothed peak against 1.5 × 0.77 A = 1.155 A (hand calculation, α = 8.011).
    expect(lines.slice(h7, h7 + 5)).toEqual(["h7", "0.637", "1.155", "0.77", "A"]);
    // % of the TABLE limit: 0.637 / 0.77 = 82.7 % (not 0.637 / 1.155 = 55.2 %), the rule's 150 % beside it (issue 11 §2).
    expect(lines.slice(h7 + 5, h7 + 9)).toEqual(["82.7 %", "+0.518", "Pass", "max 1.5 s smoothed ×1.5"]);
    const h3 = lines.indexOf("h3");
    expect(lines[h3 + 8]).toBe("mean 1.5 s smoothed");
    expect(lines.join("\n")).toContain("applied over 10 values");
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

describe("sheet PDF: tables over several pages", () => {
  test("every page that continues a per-order table starts it with the header row again", async () => {
    const sheet = makeSheet(
      "ieee-519-2014-current",
      { channels: ["a", "b", "c"].map((phase) => ({ name: `I${phase.toUpperCase()}`, phase, fundamentalRms: 250, harmonics: { 5: 10, 7: 6, 11: 3 } })) },
      { iscA: 8200, ilA: 260, busVoltageV: 11000 },
    );
    const pages = pdfPageTexts(await buildSheetPdf(sheet, { compress: false })).map((page) => page.split("\n"));
    const withOrders = pages.filter((lines) => lines.some((l) => /^h\d+$/.test(l)));
    // Three channels of orders 2–50 do not fit on one page after page 1's summary.
    expect(withOrders.length).toBeGreaterThan(1);
    for (const lines of withOrders) {
      const firstOrder = lines.findIndex((l) => /^h\d+$/.test(l));
      expect(lines.slice(0, firstOrder)).toContain("Table limit");
    }
  });
});

describe("sheet PDF: declared and measured power (IEC 61000-3-2 Class D, Table 3)", () => {
  test("page 1 lists declared, measured and used power with the reason", async () => {
    const sheet = makeSheet(
      "iec-61000-3-2-class-d",
      {
        channels: [{ name: "I", fundamentalRms: 1.3, harmonics: { 3: 1.5 } }],
        power: { phases: [{ voltage: "U", current: "I", activePowerW: 300, apparentPowerVA: 300, displacementFactor: 1, distortionFactor: 1, truePowerFactor: 1 }], total: null },
      },
      { ratedPowerW: 600 },
    );
    const text = pdfText(await buildSheetPdf(sheet, { compress: false, generatedAt: new Date("2026-03-03T00:00:00Z") })).replace(/\s+/g, " ");
    expect(text).toContain("Declared power 600 W");
    expect(text).toContain("Measured active power 300 W");
    expect(text).toContain("the limits use the measured 300 W");
  });
});
