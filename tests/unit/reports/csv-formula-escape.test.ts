import Papa from "papaparse";
import { describe, expect, test } from "vitest";
import { buildSheetCsv } from "@/lib/reports/build-sheet-csv";
import { makeSheet } from "./make-sheet";

// CSV injection: spreadsheet programs treat a cell beginning with =, +, -, @ (and, after trimming, tab or
// carriage return) as a formula; the usual defence is a leading apostrophe, which makes the cell text
// (OWASP, "CSV Injection", common practice). Class A limits from IEC 61000-3-2 Table 1: h3 2.30 A.
const hostile = ["=HYPERLINK(\"http://evil.example\",\"x\")", "+1+cmd|' /C calc'!A0", "-2+3", "@SUM(A1:A9)", "\t=1+1", "\r=1+1"];

describe("sheet CSV neutralises formulas", () => {
  for (const text of hostile) {
    test(`a title or channel name starting with ${JSON.stringify(text.slice(0, 2))} is written as text`, () => {
      const sheet = makeSheet("iec-61000-3-2-class-a", { channels: [{ name: text, fundamentalRms: 8, harmonics: { 3: 2.5 } }] });
      sheet.capture.title = text;
      // Read back with an independent CSV reader: every cell that held the text now starts with an apostrophe.
      const cells = Papa.parse<string[]>(buildSheetCsv(sheet).replace(/^\uFEFF/, ""), { skipEmptyLines: true }).data.flat();
      const holding = cells.filter((c) => c.includes(text.trim() === text ? text : text.slice(1)));
      expect(holding.length).toBeGreaterThanOrEqual(2); // title and channel column
      for (const c of holding) expect(c).toBe(`'${text}`);
      expect(cells.some((c) => /^[=+\-@\t\r]/.test(c) && Number.isNaN(Number(c)))).toBe(false);
    });
  }

  test("negative numbers stay numbers: the h3 margin is -0.2 (2.30 − 2.5, IEC 61000-3-2 Table 1), unquoted and unprefixed", () => {
    const sheet = makeSheet("iec-61000-3-2-class-a", { channels: [{ name: "I (A)", fundamentalRms: 8, harmonics: { 3: 2.5 } }] });
    const line = buildSheetCsv(sheet).split("\r\n").find((l) => l.startsWith("I (A),3,"))!;
    expect(line.split(",")[6]).toBe("-0.2");
  });
});
