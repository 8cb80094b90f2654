// CSV import variants and input errors, on the committed fixtures (fixtures/generate.ts).
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, test } from "vitest";
import { analyzeCsvFile } from "@/lib/analysis/analyze-csv-file";
import { analyzeCsvText } from "@/lib/analysis/analyze-csv-text";
import { AnalysisInputError } from "@/lib/analysis/errors";
import { importCsvFile, importCsvText } from "@/lib/analysis/import-csv";
import { inspectCsv } from "@/lib/analysis/inspect-csv";

const fixture = (name: string): string => join(process.cwd(), "fixtures", name);
const read = (name: string): string => readFileSync(fixture(name), "utf8");
/**
 * The generator's signals (fixtures/generate.ts) are finite Fourier series: voltage fundamental 325 V
 * peak, current fundamental 14.1 A peak, so the expected r.m.s. values are peak/√2 (analytic Fourier
 * series of the test signal); frequencies, sample rates and the 0.8 A DC offset are the generator's settings.
 */
const V1 = 325 / Math.SQRT2;
const I1 = 14.1 / Math.SQRT2;

function inputError(fn: () => unknown): AnalysisInputError {
  try {
    fn();
  } catch (error) {
    expect(error).toBeInstanceOf(AnalysisInputError);
    return error as AnalysisInputError;
  }
  throw new Error("expected an AnalysisInputError");
}

describe("import variants", () => {
  test("comma, units in ( ), time in s: interval fitted from the time column, V–I pair formed", () => {
    const r = analyzeCsvText(read("single-phase-50hz.csv"));
    expect(r.sampleIntervalS).toBeCloseTo(1 / 6400, 12);
    expect(r.sampleIntervalSource).toBe("time-column");
    expect(r.fundamentalHz).toBeCloseTo(50.02, 2);
    expect(r.window.count).toBe(2);
    expect(r.channels.map((c) => [c.name, c.quantity, c.unit])).toEqual([
      ["V (V)", "voltage", "V"],
      ["I (A)", "current", "A"],
    ]);
    expect(r.channels[1]!.fundamentalRms).toBeCloseTo(I1, 2);
    expect(r.power.phases).toHaveLength(1);
  });

  test("semicolon + decimal comma, [unit], time in ms, L1/L2/L3 names: three-phase sets, pairs per phase, 60 Hz", () => {
    const r = analyzeCsvText(read("three-phase-60hz-semicolon.csv"));
    expect(r.nominalHz).toBe(60);
    expect(r.window.cycles).toBe(12);
    expect(r.sampleIntervalS).toBeCloseTo(1 / 7680, 10);
    expect(r.channels.map((c) => c.phase)).toEqual(["a", "b", "c", "a", "b", "c"]);
    expect(r.power.phases.map((p) => [p.voltage, p.current])).toEqual([
      ["UL1 [V]", "IL1 [A]"],
      ["UL2 [V]", "IL2 [A]"],
      ["UL3 [V]", "IL3 [A]"],
    ]);
    expect(r.power.total!.activePowerW).toBeCloseTo(r.power.phases.reduce((s, p) => s + p.activePowerW, 0), 6);
    expect(r.sequence!.map((s) => s.quantity)).toEqual(["voltage", "current"]);
    expect(r.channels[0]!.fundamentalRms).toBeCloseTo(V1, 0);
  });

  test("tab, key/value preamble with the interval, no time column, _V/_A names, exactly one window", () => {
    const r = analyzeCsvText(read("tab-preamble-one-window.csv"));
    expect(r.sampleIntervalSource).toBe("preamble");
    expect(r.sampleIntervalS).toBe(1.5625e-4);
    expect(r.window.count).toBe(1);
    expect(r.channels.map((c) => [c.name, c.quantity, c.phase])).toEqual([
      ["Va_V", "voltage", "a"],
      ["Ia_A", "current", "a"],
    ]);
    expect(Math.abs(r.fundamentalHz - 50)).toBeLessThan(0.01);
  });

  test("separate units row: ms time and mA current converted to s and A", () => {
    const r = analyzeCsvText(read("units-row.csv"));
    expect(r.sampleIntervalS).toBeCloseTo(1 / 6400, 10);
    expect(r.channels[1]!.unit).toBe("A");
    expect(r.channels[1]!.fundamentalRms).toBeCloseTo(I1, 2);
  });

  test("µs time stamps rounded to 6 significant digits: least-squares interval within 1 ppm", () => {
    const r = analyzeCsvText(read("scope-microseconds.csv"));
    expect(Math.abs(r.sampleIntervalS * 6400 - 1)).toBeLessThan(1e-6);
    expect(r.channels[0]!.quantity).toBe("current");
    expect(Math.abs(r.fundamentalHz - 49.9)).toBeLessThan(0.01);
  });

  test("sample rate in a 'key: value' preamble (12.8 kS/s)", () => {
    const r = analyzeCsvText(read("preamble-rate.csv"));
    expect(r.sampleIntervalS).toBeCloseTo(1 / 12_800, 15);
    expect(r.channels.map((c) => c.phase)).toEqual(["b", "b"]);
  });

  test("user interval overrides a missing one; quantity override maps an unnamed column", () => {
    const r = analyzeCsvText(read("error-no-interval.csv"), { sampleIntervalS: 1 / 6400 });
    expect(r.sampleIntervalSource).toBe("option");
    const text = "Va (V),X1\n" + read("error-no-interval.csv").split("\n").slice(1).join("\n");
    const skipped = analyzeCsvText(text, { sampleIntervalS: 1 / 6400 });
    expect(skipped.channels).toHaveLength(1);
    expect(skipped.warnings.some((w) => w.includes("X1"))).toBe(true);
    const mapped = analyzeCsvText(text, { sampleIntervalS: 1 / 6400, channels: { x1: { quantity: "current" } } });
    expect(mapped.channels[1]!.quantity).toBe("current");
  });

  test("a clamp recorded in mV: named current, warned, and the scale factor (A per V) gives amperes", () => {
    const plain = analyzeCsvText(read("clamp-millivolts.csv"));
    expect(plain.channels[1]!.quantity).toBe("current");
    expect(plain.warnings.some((w) => /named as a current but recorded in mV/.test(w))).toBe(true);
    const scaled = analyzeCsvText(read("clamp-millivolts.csv"), { channels: { "Ia (mV)": { scale: 10 } } });
    expect(scaled.channels[1]!.fundamentalRms).toBeCloseTo(I1, 2);
    expect(scaled.warnings.some((w) => /named as a current/.test(w))).toBe(false);
  });

  test("CT ratio scale factor multiplies the channel", () => {
    const r = analyzeCsvText(read("single-phase-50hz.csv"), { channels: { I: { scale: 40 } } });
    expect(r.channels[1]!.fundamentalRms).toBeCloseTo(40 * I1, 0);
  });

  // These records fit the look-ahead, so the file path reads them with its row collector and then runs the
  // in-memory analysis: this compares the two importers (streamed rows vs. the text import), not two analyses.
  test("the file reader imports a short record exactly as the text import does", async () => {
    for (const name of ["single-phase-50hz.csv", "three-phase-60hz-semicolon.csv", "tab-preamble-one-window.csv", "units-row.csv"]) {
      const fromFile = await analyzeCsvFile(fixture(name));
      expect(fromFile).toEqual(analyzeCsvText(read(name)));
    }
  });

  test("a file is read as bytes in 1 MB chunks: lines cut between chunks, CR LF, a byte-order mark, odd lines and a quoted line halfway give the text path's samples", async () => {
    // 40,000 rows ≈ 1.3 MB, so the file arrives in two chunks with a line cut between them.
    const lines = ["Time (s),Va (V),Ia (A)"];
    for (let k = 0; k < 40_000; k++) {
      const t = (k / 6400).toFixed(7);
      const va = (325 * Math.cos((2 * Math.PI * 50 * k) / 6400)).toFixed(3);
      const ia = (14.1 * Math.cos((2 * Math.PI * 50 * k) / 6400 - 0.5)).toFixed(4);
      // Lines the byte scanner cannot read itself: spaces, an exponent of more digits, a leading "+", a quoted cell.
      if (k === 1_000) lines.push(`${t}, ${va} ,${ia}`);
      else if (k === 2_000) lines.push(`${t},${va},${Number(ia).toExponential(17)}`);
      else if (k === 3_000) lines.push(`+${t},${va},${ia}`);
      else if (k === 30_000) lines.push(`${t},"${va}",${ia}`);
      else lines.push(`${t},${va},${ia}`);
    }
    const text = `\uFEFF${lines.join("\r\n")}\r\n`;
    const dir = mkdtempSync(join(tmpdir(), "ordwise-import-"));
    try {
      const path = join(dir, "crlf-bom.csv");
      writeFileSync(path, text);
      const fromFile = await importCsvFile(path);
      // The text path reads a file with a quote through papaparse from its first line: an independent reader.
      const fromText = importCsvText(text);
      expect(fromFile.rowCount).toBe(40_000);
      expect(fromFile.channels.map((c) => Array.from(c.samples))).toEqual(fromText.channels.map((c) => Array.from(c.samples)));
      expect(fromFile.sampleIntervalS).toBe(fromText.sampleIntervalS);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });

  test("quoted cells go through papaparse and give the same samples", () => {
    const text = read("single-phase-50hz.csv");
    const quoted = text.split("\n").map((l, i) => (i === 0 || l === "" ? l : l.split(",").map((f) => `"${f}"`).join(","))).join("\n");
    expect(importCsvText(quoted).channels[1]!.samples).toEqual(importCsvText(text).channels[1]!.samples);
  });
});

describe("warnings", () => {
  test("clipping: runs of samples stuck at the extreme", () => {
    expect(analyzeCsvText(read("clipped.csv")).warnings.some((w) => /possible clipping/.test(w))).toBe(true);
    expect(analyzeCsvText(read("single-phase-50hz.csv")).warnings.some((w) => /clipping/.test(w))).toBe(false);
  });
  test("DC offset", () => {
    const r = analyzeCsvText(read("dc-offset.csv"));
    expect(r.channels[0]!.dc).toBeCloseTo(0.8, 3);
    expect(r.warnings.some((w) => /DC offset/.test(w))).toBe(true);
  });
  test("sampling rate too low for upper orders: orders above are null, never 0", () => {
    const r = analyzeCsvText(read("low-rate.csv"));
    expect(r.maxResolvableOrder).toBe(16);
    expect(r.channels[0]!.harmonics[16]!.rms).toBeNull();
    expect(r.channels[0]!.harmonics[10]!.rms).toBeCloseTo(0.6 / Math.SQRT2, 3);
    expect(r.warnings.some((w) => /not evaluated/.test(w))).toBe(true);
  });
});

describe("input errors name the problem and the line", () => {
  test.each([
    ["error-empty.csv", "empty-file", /file is empty/, undefined, undefined],
    ["error-no-numeric.csv", "no-numeric-columns", /no numeric columns/, undefined, undefined],
    ["error-non-numeric.csv", "non-numeric-cell", /non-numeric cell at line 57, column 3 \(I \(A\)\): "abc"/, 57, 3],
    ["error-empty-cell.csv", "non-numeric-cell", /line 102, column 2 \(V \(V\)\): an empty cell/, 102, 2],
    ["error-non-monotonic.csv", "non-monotonic-time", /time axis runs backwards at line 702: .* \(not monotonic\)/, 702, 1],
    ["error-irregular.csv", "irregular-time", /irregular time axis at line 802/, 802, 1],
    ["error-too-short.csv", "too-short", /shorter than one analysis window/, undefined, undefined],
    ["error-constant.csv", "constant-channel", /channel I \(A\) is constant/, undefined, undefined],
    ["error-ragged.csv", "ragged-row", /line 1401 has 2 fields/, 1401, 3],
    ["error-no-interval.csv", "no-sample-interval", /no sample interval/, undefined, undefined],
  ])("%s → %s", async (name, code, message, line, column) => {
    const error = inputError(() => analyzeCsvText(read(name)));
    expect(error.code).toBe(code);
    expect(error.message).toMatch(message);
    expect(error.line).toBe(line);
    expect(error.column).toBe(column);
    // the streaming path reports the same
    await expect(analyzeCsvFile(fixture(name))).rejects.toMatchObject({ code, message: error.message });
  });

  test("unreadable file", async () => {
    await expect(analyzeCsvFile(fixture("does-not-exist.csv"))).rejects.toMatchObject({ code: "unreadable-file" });
  });

  test("bad options are input errors", () => {
    expect(inputError(() => analyzeCsvText(read("single-phase-50hz.csv"), { maxOrder: 0 })).code).toBe("invalid-option");
    expect(inputError(() => analyzeCsvText(read("single-phase-50hz.csv"), { frequencyHz: 60 })).message).toMatch(/does not match the given nominal 60 Hz/);
  });
});

describe("inspectCsv", () => {
  test("reports layout, columns and interval without analysing", () => {
    const preview = inspectCsv(read("three-phase-60hz-semicolon.csv").slice(0, 4000));
    expect(preview.delimiter).toBe(";");
    expect(preview.decimalSeparator).toBe(",");
    expect(preview.headerLine).toBe(1);
    expect(preview.dataStartLine).toBe(2);
    expect(preview.columns[0]).toMatchObject({ role: "time", unit: "ms" });
    expect(preview.columns.slice(1).map((c) => `${c.quantity}:${c.phase}`)).toEqual([
      "voltage:a", "voltage:b", "voltage:c", "current:a", "current:b", "current:c",
    ]);
    expect(preview.sampleIntervalS!).toBeCloseTo(1 / 7680, 9);
  });
  test("preamble and units row", () => {
    const tab = inspectCsv(read("tab-preamble-one-window.csv"));
    expect(tab.preamble.map((p) => p.key)).toContain("Sample Interval");
    expect(tab.sampleIntervalSource).toBe("preamble");
    expect(tab.headerLine).toBe(6);
    const units = inspectCsv(read("units-row.csv"));
    expect(units.unitsLine).toBe(2);
    expect(units.columns.map((c) => c.unit)).toEqual(["ms", "V", "mA"]);
  });
});
