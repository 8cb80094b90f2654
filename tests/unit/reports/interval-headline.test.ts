// Headline numbers of an interval log: its logged columns over the logged period, worked by hand from a
// log written out here (20 rows of 10 minutes, row k = 1…20: I1 r.m.s. k A, THD k %, fundamental 10 A;
// V1 THD 1 % with no r.m.s. column), through the worker's pipeline, the sheet's tables, the CSV and the PDF.
import { describe, expect, test } from "vitest";
import { EvaluationContextSchema } from "@/lib/compliance/model";
import { importIntervalLog } from "@/lib/intervals/import-interval-log";
import type { IntervalMappingInput } from "@/lib/intervals/types";
import { runIntervalLogEvaluation } from "@/lib/pipeline/run-interval-log-evaluation";
import { analysisSummary } from "@/lib/reports/analysis-summary";
import { buildSheetCsv } from "@/lib/reports/build-sheet-csv";
import { buildSheetPdf } from "@/lib/reports/build-sheet-pdf";
import { headlineNumbers } from "@/lib/reports/headline-numbers";
import { headlineTable, NOT_LOGGED } from "@/lib/reports/headline-table";
import { seedLimitSetRevision } from "@/lib/pipeline/seed-limit-set-revision";
import { makeSheet } from "./make-sheet";
import { pdfPageTexts } from "./pdf-text";

const rows = Array.from({ length: 20 }, (_, i) => i + 1);
const start = Date.UTC(2024, 2, 4);
const stamp = (k: number) => new Date(start + (k - 1) * 600_000).toISOString().slice(0, 19).replace("T", " ");
const text = ["Timestamp,I1 H1 avg [A],I1 H5 avg [A],I1 THD max [%],I1 rms avg [A],V1 THD avg [%]", ...rows.map((k) => `${stamp(k)},10,${k / 10},${k},${k},1`)].join("\n");
const mapping: IntervalMappingInput = {
  timestamp: { column: "Timestamp" },
  columns: [
    { column: "I1 H1 avg [A]", channel: "I1", quantity: "current", kind: "order", order: 1, unit: "A" },
    { column: "I1 H5 avg [A]", channel: "I1", quantity: "current", kind: "order", order: 5, unit: "A" },
    { column: "I1 THD max [%]", channel: "I1", quantity: "current", kind: "thd", unit: "%", statistic: "max" },
    { column: "I1 rms avg [A]", channel: "I1", quantity: "current", kind: "rms", unit: "A" },
    { column: "V1 THD avg [%]", channel: "V1", quantity: "voltage", kind: "thd", unit: "%" },
  ],
};
const context = EvaluationContextSchema.parse({ iscA: 2400, ilA: 50, busVoltageV: 480 });
const { analysis, result } = runIntervalLogEvaluation(importIntervalLog(text, mapping), seedLimitSetRevision("ieee-519-2014-current"), context, 60);

// Hand values: √(Σk²/20) = √(20·21·41/6/20) = √143.5; nearest-rank 95th percentile of 20 values = the ⌈19⌉th smallest = 19; maximum 20.
const rmsMeanK = Math.sqrt(143.5);

describe("an interval log's headline numbers", () => {
  // Read back as the sheet reads it: from the stored summary.
  const h = headlineNumbers(analysisSummary(analysis), context)!;
  const i1 = h.intervalLog!.channels.find((c) => c.name === "I1")!;

  test("r.m.s. mean, 95th percentile and maximum of the logged r.m.s. and THD; the fundamental as logged", () => {
    expect(h.intervalLog!.rowCount).toBe(20);
    expect(i1.rms!.rmsMean).toBeCloseTo(rmsMeanK, 9);
    expect(i1.rms!.p95).toBe(19);
    expect(i1.rms!.max).toBe(20);
    expect(i1.fundamental!.rmsMean).toBeCloseTo(10, 12);
    expect(i1.thdPercent!.p95).toBe(19);
    expect(i1.thdPercent!.logged).toBe("max");
  });

  test("TDD = THD × fundamental / IL per interval (IEEE Std 519-2014 clause 3 definition): k % × 10 A / 50 A = 0.2·k %", () => {
    expect(i1.tddPercent!.p95).toBeCloseTo(0.2 * 19, 9);
    expect(i1.tddPercent!.max).toBeCloseTo(0.2 * 20, 9);
    expect(i1.tddPercent!.rmsMean).toBeCloseTo(0.2 * rmsMeanK, 9);
  });

  test("the tables: statistic and unit in each label, the logger's own statistic in the cell, 'not logged' for missing columns", () => {
    const tables = headlineTable(h);
    const currents = tables.find((t) => t.key === "current")!;
    expect(currents.columns.map((c) => c.label)).toEqual([
      "RMS (A), mean",
      "RMS (A), maximum",
      "Fundamental RMS (A), mean",
      "THD (% of fundamental), 95th percentile",
      "THD (% of fundamental), maximum",
      "TDD (% of IL = 50 A), 95th percentile",
      "TDD (% of IL = 50 A), maximum",
    ]);
    expect(currents.rows[0]!.cells).toEqual(["11.98", "20", "10", "19.00 (of interval maxima)", "20.00 (of interval maxima)", "3.80 (of interval maxima)", "4.00 (of interval maxima)"]);
    expect(currents.caption).toContain("20 logged 10 min values from 2024-03-04 00:00 UTC to 2024-03-04 03:20 UTC");
    const voltages = tables.find((t) => t.key === "voltage")!;
    expect(voltages.columns.some((c) => c.label.startsWith("TDD"))).toBe(false);
    // V1 has a THD column only: no r.m.s., so no fundamental either.
    expect(voltages.rows[0]!.cells).toEqual([NOT_LOGGED, NOT_LOGGED, NOT_LOGGED, "1.00", "1.00"]);
    const absent = tables.find((t) => t.key === "not-logged")!;
    expect(absent.rows.map((r) => r.label)).toEqual(["Power (P, S, displacement, distortion and true power factor)", "Fundamental frequency", "Crest factor, K-factor", "Unbalance"]);
    expect(absent.rows.every((r) => r.cells[0]!.startsWith(NOT_LOGGED))).toBe(true);
    expect(absent.rows[1]!.cells[0]).toBe("not logged (the limits use the site's 60 Hz)");
  });

  test("a log of currents only says its voltages are not logged; without IL the TDD cells say so", () => {
    const currentsOnly = runIntervalLogEvaluation(
      importIntervalLog(text, { ...mapping, columns: mapping.columns.filter((c) => c.channel === "I1") }),
      seedLimitSetRevision("ieee-519-2014-current"),
      EvaluationContextSchema.parse({}),
      50,
    ).analysis;
    const tables = headlineTable(headlineNumbers(currentsOnly, {})!);
    expect(tables.find((t) => t.key === "not-logged")!.rows[0]).toMatchObject({ label: "Voltages (r.m.s., THD)", cells: [NOT_LOGGED] });
    const row = tables.find((t) => t.key === "current")!.rows[0]!;
    expect(row.cells.slice(-2)).toEqual(["— (no IL)", "— (no IL)"]);
  });

  test("the CSV carries the same tables with raw values and 'not logged'; page 1 of the PDF lists them", async () => {
    const sheet = { ...makeSheet("ieee-519-2014-current", { channels: [] }, context), analysis: { result: analysis, setup: { mapping: { intervalMapping: mapping }, unmappedColumns: [] } } };
    sheet.evaluation!.result = result;
    const lines = buildSheetCsv(sheet).split("\r\n");
    expect(lines).toContain(
      "Headline numbers: currents over the logged period,\"RMS (A), mean\",\"RMS (A), maximum\",\"Fundamental RMS (A), mean\",\"THD (% of fundamental), 95th percentile\",\"THD (% of fundamental), maximum\",\"TDD (% of IL = 50 A), 95th percentile\",\"TDD (% of IL = 50 A), maximum\"",
    );
    const i1Line = lines.find((l) => l.startsWith("I1,"))!.split(",");
    expect(Number(i1Line[1])).toBeCloseTo(rmsMeanK, 6);
    expect(Number(i1Line[6])).toBeCloseTo(3.8, 6);
    expect(lines).toContain("V1,not logged,not logged,not logged,1,1");
    expect(lines).toContain("\"Power (P, S, displacement, distortion and true power factor)\",not logged");
    const first = pdfPageTexts(await buildSheetPdf(sheet, { compress: false, generatedAt: new Date("2026-03-03T00:00:00Z") }))[0]!;
    expect(first).toMatch(/Headline numbers . currents over the logged period/);
    expect(first).toMatch(/Headline numbers . not in this log/);
    expect(first).toMatch(/TDD \(% of IL = 50 A\), 95th percentile 3\.80 \(of interval\s+maxima\)/);
    expect(first).toContain("Power (P, S, displacement");
    expect(first.indexOf("not logged (they need the waveform)")).toBeLessThan(first.indexOf("Evaluation context"));
  });
});
