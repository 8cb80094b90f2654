// Issue 9 §2: no non-finite number reaches a result. A cell that is not a finite double, or a value
// whose square overflows the sums (r.m.s., power), is a hard input error at its line and column —
// on the in-memory path and on the streaming path (pass 1 reads every row before any window).
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, test } from "vitest";
import { analyzeCsvFile } from "@/lib/analysis/analyze-csv-file";
import { analyzeCsvText } from "@/lib/analysis/analyze-csv-text";
import { AnalysisInputError } from "@/lib/analysis/errors";

const dir = mkdtempSync(join(tmpdir(), "ordwise-nonfinite-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const RATE = 6400;
/** Small frequency segments so 3 s of record (19,200 rows) pass the 8,192-row look-ahead and stream. */
const SEGMENT = 4096;

/** Time, Va, Ia: a clean 50 Hz pair (325 V and 14.1 A peak) — only the edited cell matters here. */
function capture(seconds: number): string[] {
  const lines = ["Time (s),Va (V),Ia (A)"];
  for (let k = 0; k < Math.round(seconds * RATE); k++) {
    const t = k / RATE;
    lines.push(`${t.toFixed(7)},${(325 * Math.sin(2 * Math.PI * 50 * t)).toFixed(3)},${(14.1 * Math.sin(2 * Math.PI * 50 * t - 0.5)).toFixed(4)}`);
  }
  return lines;
}

/** Replaces field `column` (1-based) of 1-based line `line`. */
function edit(lines: string[], line: number, column: number, cell: string): string {
  const copy = [...lines];
  const fields = copy[line - 1]!.split(",");
  fields[column - 1] = cell;
  copy[line - 1] = fields.join(",");
  return `${copy.join("\n")}\n`;
}

function syncError(fn: () => unknown): AnalysisInputError {
  try {
    fn();
  } catch (error) {
    expect(error).toBeInstanceOf(AnalysisInputError);
    return error as AnalysisInputError;
  }
  throw new Error("expected an AnalysisInputError, the analysis returned a result");
}

// Double-precision range (largest finite value ≈ 1.8·10^308, so the square root of it ≈ 1.3·10^154):
// IEEE 754-2019 §3.6, binary64 parameters.
const cases: [string, string, string, RegExp][] = [
  ["1e308 (finite, but its square overflows)", "1e308", "value-out-of-range", /value out of range .*overflow the sums of squares/],
  ["2e154 (just past the square-root of the double range)", "2e154", "value-out-of-range", /value out of range/],
  ["-3e200", "-3e200", "value-out-of-range", /value out of range/],
  ["1e400 (beyond double precision)", "1e400", "value-out-of-range", /"1e400" is beyond the range of a double-precision number/],
  ["inf", "inf", "non-numeric-cell", /"inf", not a finite number/],
  ["Infinity", "Infinity", "non-numeric-cell", /"Infinity", not a finite number/],
  ["NaN", "NaN", "non-numeric-cell", /"NaN", not a finite number/],
];

describe("in memory: a non-finite or overflowing value is an error at its line and column", () => {
  const lines = capture(0.5);
  test.each(cases)("%s", (_name, cell, code, message) => {
    const error = syncError(() => analyzeCsvText(edit(lines, 1234, 3, cell)));
    expect(error.code).toBe(code);
    expect(error.message).toMatch(message);
    expect(error.message).toMatch(/line 1234, column 3 \(Ia \(A\)\)/);
    expect(error.line).toBe(1234);
    expect(error.column).toBe(3);
  });

  test("a scale factor that pushes a plausible value past the range is caught too (column 2, after ×1e95)", () => {
    const error = syncError(() => analyzeCsvText(edit(lines, 50, 2, "12345678"), { channels: { Va: { scale: 1e95 } } }));
    expect(error).toMatchObject({ code: "value-out-of-range", line: 50, column: 2 });
  });

  test("a time stamp out of range names the time column", () => {
    const error = syncError(() => analyzeCsvText(edit(lines, 900, 1, "1e300")));
    expect(error).toMatchObject({ code: "value-out-of-range", line: 900, column: 1 });
  });
});

describe("streaming: the same errors, found in pass 1 past the look-ahead", () => {
  const lines = capture(3);
  test.each(cases)("%s", async (_name, cell, code, message) => {
    const text = edit(lines, 15_001, 3, cell);
    const path = join(dir, `late-${code}-${cell}.csv`);
    writeFileSync(path, text);
    const expected = syncError(() => analyzeCsvText(text));
    let caught: unknown = null;
    try {
      await analyzeCsvFile(path, {}, undefined, { segmentSamples: SEGMENT });
    } catch (error) {
      caught = error;
    }
    expect(caught).toBeInstanceOf(AnalysisInputError);
    const error = caught as AnalysisInputError;
    expect(error.code).toBe(code);
    expect(error.message).toMatch(message);
    expect(error.line).toBe(15_001);
    expect(error.column).toBe(3);
    expect(error.message).toBe(expected.message);
  });
});
