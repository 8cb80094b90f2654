// The streaming file path (two passes, ring buffer, fundamental tracked per window) against the in-memory
// path on the same records: same results within floating-point noise, same errors and lines.
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, test } from "vitest";
import { analyzeCsvFile } from "@/lib/analysis/analyze-csv-file";
import { analyzeCsvText } from "@/lib/analysis/analyze-csv-text";
import { analyzeImported } from "@/lib/analysis/analyze-imported";
import { AnalysisInputError } from "@/lib/analysis/errors";
import { importCsvText } from "@/lib/analysis/import-csv";
import type { AnalysisOptions, AnalysisResult } from "@/lib/analysis/types";
import { driftingCaptureText } from "./signals";

const dir = mkdtempSync(join(tmpdir(), "ordwise-stream-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** Small segments so a few seconds of record take the streaming path (look-ahead = 2 segments = 8192 rows). */
const SEGMENT = 4096;
const RATE = 6400;

/**
 * Va, Ia, Vb, Ib at 6.4 kS/s, fundamental drifting 49.9 → 50.1 Hz, 5th/7th/11th harmonics, a DC
 * offset on Ia and Ib clipped at 95 % of its peak (so both warnings appear).
 */
function captureText(seconds: number): string {
  return driftingCaptureText(seconds, RATE);
}

function write(name: string, text: string): string {
  const path = join(dir, name);
  writeFileSync(path, text);
  return path;
}

/** Largest relative difference between two results (numbers compared as |a − b| / max(|a|, |b|, floor)). */
function compare(a: unknown, b: unknown, path: string, out: { worst: number; where: string; mismatches: string[] }, floor: number): void {
  if (typeof a === "number" && typeof b === "number") {
    const d = Math.abs(a - b) / Math.max(floor, Math.abs(a), Math.abs(b));
    if (d > out.worst) {
      out.worst = d;
      out.where = `${path}: ${a} vs ${b}`;
    }
    return;
  }
  if (a !== null && typeof a === "object") {
    if (b === null || typeof b !== "object") {
      out.mismatches.push(path);
      return;
    }
    const keys = new Set([...Object.keys(a), ...Object.keys(b)]);
    for (const key of keys) compare((a as Record<string, unknown>)[key], (b as Record<string, unknown>)[key], `${path}.${key}`, out, floor);
    return;
  }
  if (a !== b) out.mismatches.push(`${path}: ${String(a)} vs ${String(b)}`);
}

function inMemory(text: string, options: AnalysisOptions): AnalysisResult {
  return analyzeImported(importCsvText(text), { ...options, frequencySegmentSamples: SEGMENT });
}

async function inputError(run: () => Promise<unknown>): Promise<AnalysisInputError> {
  try {
    await run();
  } catch (error) {
    if (error instanceof AnalysisInputError) return error;
    throw error;
  }
  throw new Error("expected an AnalysisInputError");
}

function syncError(run: () => unknown): AnalysisInputError {
  try {
    run();
  } catch (error) {
    if (error instanceof AnalysisInputError) return error;
    throw error;
  }
  throw new Error("expected an AnalysisInputError");
}

// Each test reads and analyses a 38,400-row file (twice): allow for a loaded machine.
describe("streaming analysis of a file agrees with the in-memory path", { timeout: 30_000 }, () => {
  const text = captureText(6); // 38,400 rows: 9 frequency segments, 30 windows
  const path = write("drifting-6s.csv", text);
  const options: AnalysisOptions = { includeOrderSeries: true, thdMaxOrder: 50, ilA: 12 };

  test("orders, THD, groups, power, sequence, per-window series and warnings", async () => {
    const streamed = await analyzeCsvFile(path, options, undefined, { segmentSamples: SEGMENT });
    const memory = inMemory(text, options);
    expect(streamed.window).toEqual(memory.window);
    expect(streamed.window.count).toBeGreaterThanOrEqual(29);
    expect(streamed.warnings).toEqual(memory.warnings);
    expect(streamed.warnings.some((w) => /Ia.*DC offset/.test(w))).toBe(true);
    expect(streamed.warnings.some((w) => /Ib.*possible clipping/.test(w))).toBe(true);
    expect(streamed.channels[1]!.harmonicSeries?.[4]).toHaveLength(streamed.window.count);
    const diff = { worst: 0, where: "", mismatches: [] as string[] };
    // Floor of 1e-6 (units of A, V, %, degrees): values near zero (phases of absent orders) differ in absolute terms only.
    compare(memory, streamed, "", diff, 1e-6);
    expect(diff.mismatches).toEqual([]);
    // Same fit, same windows; the streaming path measures its segments against the look-ahead's provisional rate: floating-point noise.
    expect(diff.worst, diff.where).toBeLessThan(1e-6);
  });

  test("pass 2 gives the same result, number for number, from the rows pass 1 kept and from reading the file again", async () => {
    const kept = await analyzeCsvFile(path, options, undefined, { segmentSamples: SEGMENT });
    const reread = await analyzeCsvFile(path, options, undefined, { segmentSamples: SEGMENT, keepRowsBytes: 0 });
    expect(kept).toEqual(reread);
  });

  test("every window is cut to its own fundamental: a 0.2 Hz ramp keeps every window whole", async () => {
    const streamed = await analyzeCsvFile(path, options, undefined, { segmentSamples: SEGMENT });
    // Analytic: the record's frequency ramps 49.9 → 50.1 Hz (driftingCaptureText), 50 Hz on average.
    expect(streamed.fundamentalHz).toBeCloseTo(50, 2);
    // Leakage from a window off by 0.1 Hz would make the fundamental swing; per-segment windows keep it steady.
    const series = streamed.channels[0]!.series!.fundamentalRms;
    expect(Math.max(...series) - Math.min(...series)).toBeLessThan(0.05);
  });

  test("the waveform excerpt: first 3 cycles, ≤ 600 points, same on both sides of the look-ahead", async () => {
    const streamed = await analyzeCsvFile(path, { keepWaveformCycles: 3 }, undefined, { segmentSamples: SEGMENT });
    const short = write("drifting-1s.csv", captureText(1));
    const fromMemory = await analyzeCsvFile(short, { keepWaveformCycles: 3 });
    for (const result of [streamed, fromMemory]) {
      const waveform = result.waveform!;
      expect(waveform.timeS.length).toBeGreaterThan(100);
      expect(waveform.timeS.length).toBeLessThanOrEqual(600);
      expect(waveform.timeS.at(-1)!).toBeLessThan(3 / 49.8);
      expect(waveform.channels.map((c) => c.unit)).toEqual(["V", "A", "V", "A"]);
      expect(waveform.channels[0]!.values).toHaveLength(waveform.timeS.length);
      // Analytic: Va at t = 0 is 325·cos 0 + 6·cos(0.3), as driftingCaptureText writes it.
      expect(waveform.channels[0]!.values[0]).toBeCloseTo(325 + 6 * Math.cos(0.3), 1);
    }
    // The kept points are samples 0, step, 2·step … of the file, as read.
    const rows = text.split("\n").slice(1, 1 + 400);
    const step = Math.round(streamed.waveform!.timeS[1]! * RATE);
    expect(streamed.waveform!.channels[1]!.values.slice(0, 20)).toEqual(rows.filter((_, i) => i % step === 0).slice(0, 20).map((l) => Number(l.split(",")[2])));
  });

  test("an ignored column is left out silently, on both paths", async () => {
    const channels = { "Vb (V)": { ignore: true } };
    const streamed = await analyzeCsvFile(path, { channels }, undefined, { segmentSamples: SEGMENT });
    expect(streamed.channels.map((c) => c.name)).toEqual(["Va (V)", "Ia (A)", "Ib (A)"]);
    expect(streamed.warnings.some((w) => /Vb/.test(w))).toBe(false);
    expect(analyzeCsvText(text, { channels }).channels.map((c) => c.name)).toEqual(["Va (V)", "Ia (A)", "Ib (A)"]);
  });

  test("a record within the look-ahead whose head promised a longer one (its rows packed, then unpacked in place) is analysed exactly like the text path", async () => {
    // 7,680 rows (< 2 segments of 4,096): the head's short rows promise ~13,000, the later ones are padded.
    const text = captureText(1.2)
      .split("\n")
      .map((line, i) => (i > 6000 && line ? line.split(",").map((c) => c.padStart(40)).join(",") : line))
      .join("\n");
    const path = write("drifting-1.2s-long-tail.csv", text);
    const fromFile = await analyzeCsvFile(path, options, undefined, { segmentSamples: SEGMENT });
    expect(fromFile).toEqual(analyzeCsvText(text, { ...options, frequencySegmentSamples: SEGMENT }));
  });

  test("a record within the look-ahead is analysed exactly like the text path", async () => {
    const short = write("drifting-1s-b.csv", captureText(1));
    const { waveform, ...fromFile } = await analyzeCsvFile(short, options);
    expect(waveform).toBeUndefined();
    expect(fromFile).toEqual(analyzeCsvText(captureText(1), options));
  });
});

test("a long record without a time column takes its interval from the preamble", async () => {
  const body = captureText(3)
    .split("\n")
    .map((line) => line.split(",").slice(1).join(","))
    .join("\n");
  const text = `Sample Interval,${(1 / RATE).toExponential(4)} s\n${body}`;
  const path = write("preamble-3s.csv", text);
  const streamed = await analyzeCsvFile(path, {}, undefined, { segmentSamples: SEGMENT });
  const memory = inMemory(text, {});
  expect(streamed.sampleIntervalSource).toBe("preamble");
  expect(streamed.sampleIntervalS).toBe(memory.sampleIntervalS);
  const diff = { worst: 0, where: "", mismatches: [] as string[] };
  compare(memory, streamed, "", diff, 1e-6);
  expect(diff.mismatches).toEqual([]);
  expect(diff.worst, diff.where).toBeLessThan(1e-9);
});

describe("errors on late lines keep their line numbers in the streaming path", () => {
  const text = captureText(3); // 19,200 rows, past the 8,192-row look-ahead
  const lines = text.split("\n");
  const late = 15_001; // 1-based line number in the file

  const withLine = (replace: (line: string) => string): string => {
    const copy = [...lines];
    copy[late - 1] = replace(copy[late - 1]!);
    return copy.join("\n");
  };

  test.each([
    ["non-numeric cell", (l: string) => l.replace(/,([^,]+)$/, ",abc"), "non-numeric-cell", 5],
    ["ragged row", (l: string) => l.split(",").slice(0, 3).join(","), "ragged-row", 4],
    ["time going backwards", (l: string) => l.replace(/^[^,]+/, "0.5"), "non-monotonic-time", 1],
    ["a dropped sample (step of two intervals)", (l: string) => l.replace(/^[^,]+/, (t) => (Number(t) + 1 / RATE).toFixed(7)), "irregular-time", 1],
  ])("%s", async (_name, edit, code, column) => {
    const bad = withLine(edit);
    const path = write(`late-${code}.csv`, bad);
    const expected = syncError(() => analyzeCsvText(bad));
    expect(expected.line).toBe(late);
    const error = await inputError(() => analyzeCsvFile(path, {}, undefined, { segmentSamples: SEGMENT }));
    expect(error.code).toBe(code);
    expect(error.line).toBe(late);
    expect(error.column).toBe(column);
    expect(error.message).toBe(expected.message);
  });

  test("a constant channel is found from the running extremes", async () => {
    const flat = lines.map((l, i) => (i === 0 || l === "" ? l : l.replace(/,([^,]+)$/, ",0.0000"))).join("\n");
    const path = write("late-constant.csv", flat);
    const expected = syncError(() => analyzeCsvText(flat));
    const error = await inputError(() => analyzeCsvFile(path, {}, undefined, { segmentSamples: SEGMENT }));
    expect(error.code).toBe("constant-channel");
    expect(error.message).toBe(expected.message);
  });
});
