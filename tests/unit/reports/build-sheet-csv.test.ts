import { describe, expect, test } from "vitest";
import { buildSheetCsv } from "@/lib/reports/build-sheet-csv";
import { makeSheet } from "./make-sheet";

// Class A limits from IEC 61000-3-2 Table 1: h3 2.30 A, h5 1.14 A, h7 0.77 A.
const sheet = makeSheet("iec-61000-3-2-class-a", {
  channels: [{ name: "I (A)", fundamentalRms: 8, harmonics: { 3: 2.5, 5: 1.0, 7: 0.5 } }],
});
const csv = buildSheetCsv(sheet);
const lines = csv.trimEnd().split("\r\n");
const HEADER = "channel,order,measured,limit,unit,percent_of_limit,margin,verdict,decided_by,table_limit,reason";
const headerAt = lines.indexOf(HEADER);
const orderLines = lines.slice(headerAt + 1, lines.indexOf("", headerAt));
const rows = orderLines.map((l) => l.split(","));

describe("sheet CSV", () => {
  test("header block names the capture, limit set and revision", () => {
    expect(lines[0]).toBe("Capture,\"Bench B kettle, run 2\"");
    expect(csv).toContain("Limit set,IEC 61000-3-2 Class A");
    // The set's name, not its internal key.
    expect(csv).not.toContain("iec-61000-3-2-class-a");
    expect(csv).toContain("Revision,1\r\n");
    expect(csv).toContain("Overall verdict,fail");
    expect(headerAt).toBeGreaterThan(0);
    expect(lines[headerAt - 1]).toBe("");
  });

  test("one row per order with measured, limit, percent, margin and verdict (Table 1, from hand calculation)", () => {
    expect(rows.length).toBe(sheet.evaluation!.result.rows.length);
    expect(rows.map((r) => Number(r[1]))).toEqual(sheet.evaluation!.result.rows.map((r) => r.order));
    const h3 = rows.find((r) => r[1] === "3")!;
    expect(h3.slice(0, 5)).toEqual(["I (A)", "3", "2.5", "2.3", "A"]);
    expect(Number(h3[5])).toBeCloseTo(108.69565, 4); // 2.5 / 2.3
    expect(Number(h3[6])).toBeCloseTo(-0.2, 9);
    expect(h3[7]).toBe("fail");
    const h5 = rows.find((r) => r[1] === "5")!;
    expect(h5[7]).toBe("pass");
    expect(Number(h5[5])).toBeCloseTo(87.719, 2); // 1.0 / 1.14
  });

  test("without per-window series the capture mean decides and the table limit equals the limit", () => {
    const h3 = rows.find((r) => r[1] === "3")!;
    expect(h3.slice(8, 10)).toEqual(["capture mean", "2.3"]);
    expect(csv).toMatch(/\r\nTime rule,"?Average of 1\.5 s smoothed values[^\r\n]*not evaluated: /);
    expect(csv).toContain("Time basis: coverage,no time rule applied");
  });

  test("a time rule that decides names itself, and a multiplied limit keeps the table limit beside it (IEC 61000-3-2 Table 1, clause 6.2)", () => {
    // 10 windows of 0.2 s = 2 s ≥ the 1.5 s minimum. h3 steady 2.5 A: average 2.5 > 2.30 A fails.
    // h7 0.3 A with one 3.0 A window: smoothed peak 0.3 + 2.7/α (α = 8.011) = 0.637 A against
    // 1.5 × 0.77 = 1.155 A (55 %) is closer to its limit than the average 0.334 A / 0.77 A (43 %).
    const timed = makeSheet("iec-61000-3-2-class-a", { channels: [{ name: "I (A)", fundamentalRms: 8, harmonics: { 3: 2.5, 5: 1.0, 7: 0.33 } }] }, {}, {
      "I (A)": { 3: Array(10).fill(2.5), 7: [...Array(9).fill(0.3), 3.0] },
    });
    const text = buildSheetCsv(timed).trimEnd().split("\r\n");
    const body = text.slice(text.indexOf(HEADER) + 1, text.indexOf("", text.indexOf(HEADER))).map((l) => l.split(","));
    const h3 = body.find((r) => r[1] === "3")!;
    expect(h3[7]).toBe("fail");
    expect(h3.slice(8, 10)).toEqual(["mean 1.5 s smoothed", "2.3"]);
    const h7 = body.find((r) => r[1] === "7")!;
    expect(h7[7]).toBe("pass");
    expect(h7[8]).toBe("max 1.5 s smoothed ×1.5");
    expect(Number(h7[3])).toBeCloseTo(1.155, 9);
    // % of the TABLE limit: 0.637 / 0.77 = 82.7 %, not 0.637 / 1.155 = 55 % (the multiplier is in the label).
    expect(Number(h7[5])).toBeCloseTo((Number(h7[2]) / 0.77) * 100, 6);
    expect(Number(h7[9])).toBeCloseTo(0.77, 9);
    expect(Number(h7[2])).toBeCloseTo(0.637, 3);
    expect(text).toContain("Time basis: coverage,every time rule applied; where a rule cannot be evaluated the capture r.m.s. mean is compared with 1.0 × the limit");
  });

  test("below-threshold rows carry their reason, quoted", () => {
    // h9 measured 0: disregarded under the 0.6 % / 5 mA rule of IEC 61000-3-2 (clause 6.2.3.4).
    const raw = lines.slice(headerAt + 1).find((l) => l.startsWith("I (A),9,"))!;
    expect(raw).toContain("below-threshold");
    expect(raw).toMatch(/,"[^"]*disregarded[^"]*"$/);
  });

  test("the aggregates follow with their verdicts and the deciding rule in words (POHC of Table 1, h21–h39)", () => {
    const start = lines.indexOf("channel,aggregate,measured,limit,unit,percent_of_limit,margin,verdict,decided_by,table_limit,reason");
    expect(start).toBeGreaterThan(headerAt);
    const aggregates = lines.slice(start + 1).map((l) => l.split(","));
    const pohc = aggregates.find((a) => a[1]?.startsWith("POHC"))!;
    expect(pohc[0]).toBe("I (A)");
    expect(pohc[7]).toBe("pass"); // no orders 21–39 measured: 0 A ≤ 0.2514 A
    expect(pohc[8]).toBe("capture mean");
  });

  test("no internal rule id or field name reaches the CSV (only the rules' words)", () => {
    const timed = makeSheet("iec-61000-3-2-class-a", { channels: [{ name: "I (A)", fundamentalRms: 8, harmonics: { 3: 2.5, 7: 0.33 } }] }, {}, {
      "I (A)": { 3: Array(10).fill(2.5), 7: [...Array(9).fill(0.3), 3.0] },
    });
    for (const text of [csv, buildSheetCsv(timed)]) {
      for (const internal of ["snapshot", "smoothed-average", "smoothed-max", "rowRules", "decidedBy", "includeOrderSeries"]) expect(text).not.toContain(internal);
    }
  });

  test("refuses a sheet without an evaluation", () => {
    expect(() => buildSheetCsv({ ...sheet, evaluation: null })).toThrow("no evaluation");
  });

  test("a text starting with = is not run as a spreadsheet formula", () => {
    const csv2 = buildSheetCsv({ ...sheet, capture: { ...sheet.capture, title: "=HYPERLINK(1)" } });
    expect(csv2.split("\r\n")[0]).toBe("Capture,\"'=HYPERLINK(1)\"");
  });
});
