// The analysis helper thread (lib/analysis/analysis-helper.ts) the command line starts: built here the
// way scripts/build-cli.mjs builds it, it must give the one-thread result number for number — also
// when a record turns out longer than its head promised and the rows cannot all be kept.
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { pathToFileURL } from "node:url";
import { build } from "esbuild";
import { afterAll, beforeAll, describe, expect, test } from "vitest";
import { AnalysisHelper } from "@/lib/analysis/analysis-helper";
import { analyzeCsvFile, type StreamTimings } from "@/lib/analysis/analyze-csv-file";
import { AnalysisInputError } from "@/lib/analysis/errors";
import { helperPartStart } from "@/lib/analysis/helper-part-start";
import { ROW_CHUNK } from "@/lib/analysis/row-collector";
import type { AnalysisOptions } from "@/lib/analysis/types";
import { driftingCaptureText } from "./signals";

const dir = mkdtempSync(join(tmpdir(), "ordwise-helper-"));
let helper: AnalysisHelper | null = null;

beforeAll(async () => {
  const outfile = join(dir, "analysis-helper-thread.mjs");
  await build({
    entryPoints: [join(process.cwd(), "lib/analysis/analysis-helper-thread.ts")],
    outfile,
    bundle: true,
    platform: "node",
    format: "esm",
    logLevel: "warning",
    banner: { js: "import { createRequire as __r } from 'node:module'; const require = __r(import.meta.url);" },
  });
  helper = AnalysisHelper.start(pathToFileURL(outfile));
}, 60_000);

afterAll(async () => {
  await helper?.close();
  rmSync(dir, { recursive: true, force: true });
});

/** Small segments so a few seconds of record take the streaming path (look-ahead = 2 segments = 8192 rows). */
const SEGMENT = 4096;
const RATE = 6400;

/** The drifting four-channel capture of signals.ts; the first `padFirst` rows padded wide. */
function captureText(seconds: number, padFirst = 0): string {
  return driftingCaptureText(seconds, RATE, padFirst);
}

describe("with the helper thread the result is the one-thread result, number for number", { timeout: 60_000 }, () => {
  const options: AnalysisOptions = { includeOrderSeries: true, thdMaxOrder: 50, ilA: 12, keepWaveformCycles: 3 };

  test("the helper thread was built and started", () => {
    expect(helper).not.toBeNull();
  });

  test("rows kept: segments measured during pass 1 and the later windows during pass 2 in the helper", async () => {
    const path = join(dir, "drifting-6s.csv");
    writeFileSync(path, captureText(6)); // 38,400 rows: 9 frequency segments, 30 windows
    const alone = await analyzeCsvFile(path, options, undefined, { segmentSamples: SEGMENT });
    const helped = await analyzeCsvFile(path, options, undefined, { segmentSamples: SEGMENT, helper });
    expect(helped.window.count).toBeGreaterThanOrEqual(29);
    expect(helped).toEqual(alone);
    // The same helper serves the next record afresh.
    const again = await analyzeCsvFile(path, options, undefined, { segmentSamples: SEGMENT, helper });
    expect(again).toEqual(alone);
  });

  test("a record longer than its head promised: the rows cannot all be kept, the segments sent are measured again here", async () => {
    // The first 7,000 rows are padded to ~200 bytes, so the head (256 kB) promises ~21,000 of the
    // 76,800 rows; 50,000 may be kept. Rows arrive in chunks of 32,768: the first is kept and its
    // segments go to the helper, the second outgrows the budget.
    const path = join(dir, "padded-head-12s.csv");
    writeFileSync(path, captureText(12, 7_000));
    const keepRowsBytes = 8 * 5 * 50_000;
    const alone = await analyzeCsvFile(path, options, undefined, { segmentSamples: SEGMENT, keepRowsBytes: 0 });
    const helped = await analyzeCsvFile(path, options, undefined, { segmentSamples: SEGMENT, keepRowsBytes, helper });
    expect(helped).toEqual(alone);
  });

  test("an input error found while the helper measures is the same error", async () => {
    const text = captureText(3);
    const lines = text.split("\n");
    lines[15_000] = lines[15_000]!.replace(/,([^,]+)$/, ",abc");
    const path = join(dir, "late-error.csv");
    writeFileSync(path, lines.join("\n"));
    const run = (withHelper: boolean): Promise<unknown> => analyzeCsvFile(path, {}, undefined, { segmentSamples: SEGMENT, helper: withHelper ? helper : null });
    const [alone, helped] = await Promise.all([run(false).catch((e: unknown) => e), run(true).catch((e: unknown) => e)]);
    expect(alone).toBeInstanceOf(AnalysisInputError);
    expect(helped).toEqual(alone);
    expect((helped as AnalysisInputError).line).toBe(15_001);
    // The helper still serves the next record.
    const path2 = join(dir, "clean-3s.csv");
    writeFileSync(path2, text);
    expect(await analyzeCsvFile(path2, options, undefined, { segmentSamples: SEGMENT, helper })).toEqual(await analyzeCsvFile(path2, options, undefined, { segmentSamples: SEGMENT }));
  });
});

describe("pass 1 read in two parts (the helper parses the later part): the one-thread rows, numbers, errors and lines", { timeout: 120_000 }, () => {
  // 30 s at 6.4 kS/s: 192,000 rows, ~8 MB. The helper's part starts about half-way: it completes the
  // main thread's last chunk of 32,768 rows, writes whole chunks into the kept columns and hands the
  // rows after the last whole chunk back (the lines below are placed from where it starts).
  const ROWS = 192_000;
  const text = captureText(30);
  const withWaveform: AnalysisOptions = { includeOrderSeries: true, thdMaxOrder: 50, ilA: 12, keepWaveformCycles: 3 };
  // Without a waveform excerpt pass 2's row checks run over the kept columns before the windows.
  const plain: AnalysisOptions = { includeOrderSeries: true, thdMaxOrder: 50, ilA: 12 };
  let splitLine = 0;
  /** A line inside the helper's first whole chunk, and one after its last whole chunk. */
  let wholeChunkLine = 0;
  let tailLine = 0;

  /** Writes `content`, runs it alone and with the helper; returns both (results or errors) and the helper's rows. */
  async function both(name: string, content: string, options: AnalysisOptions, tuning: { keepRowsBytes?: number } = {}) {
    const path = join(dir, name);
    writeFileSync(path, content);
    const timings: StreamTimings = {};
    const alone = await analyzeCsvFile(path, options, undefined, { segmentSamples: SEGMENT, ...tuning }).catch((e: unknown) => e);
    const helped = await analyzeCsvFile(path, options, timings, { segmentSamples: SEGMENT, helper, ...tuning }).catch((e: unknown) => e);
    return { alone, helped, helperRows: timings.helperParsedRows ?? 0 };
  }

  /** `text` with line `line` (1-based) changed by `edit`, which must keep its length (so the split stays where it was). */
  function edited(line: number, edit: (l: string) => string): string {
    const lines = text.split("\n");
    const changed = edit(lines[line - 1]!);
    expect(changed.length).toBe(lines[line - 1]!.length);
    lines[line - 1] = changed;
    return lines.join("\n");
  }
  /** The first digit of field 2 (Va) replaced by x: "non-numeric cell" at column 2. */
  const badVa = (l: string): string => l.replace(/,(-?)\d/, ",$1x");

  beforeAll(async () => {
    const path = join(dir, "split-25s.csv");
    writeFileSync(path, text);
    const from = helperPartStart(path, Buffer.byteLength(text));
    expect(from).not.toBeNull();
    splitLine = text.slice(0, from!).split("\n").length; // the helper's first line
    const firstWhole = Math.ceil((splitLine - 2) / ROW_CHUNK) * ROW_CHUNK; // the first row of its first whole chunk
    wholeChunkLine = firstWhole + 1_000 + 2;
    tailLine = Math.floor(ROWS / ROW_CHUNK) * ROW_CHUNK + 1_000 + 2;
    expect(firstWhole - (splitLine - 2)).toBeGreaterThan(1_000); // rows completing the main thread's chunk
    expect(tailLine - wholeChunkLine).toBeGreaterThanOrEqual(ROW_CHUNK); // at least one whole chunk
    expect(tailLine).toBeLessThan(ROWS); // rows after the last whole chunk
  });

  test("whole file: identical results with and without the waveform excerpt; the helper parsed the later part", async () => {
    for (const options of [withWaveform, plain]) {
      const { alone, helped, helperRows } = await both("split-clean.csv", text, options);
      expect(helped).toEqual(alone);
      expect(helperRows).toBe(ROWS - (splitLine - 2));
    }
  });

  test("CRLF line ends, and no newline after the last line: identical results", async () => {
    for (const [name, content] of [
      ["split-crlf.csv", text.replace(/\n/g, "\r\n")],
      ["split-no-final-newline.csv", text.slice(0, -1)],
    ] as const) {
      const { alone, helped, helperRows } = await both(name, content, plain);
      expect(helped, name).toEqual(alone);
      expect(helperRows, name).toBeGreaterThan(60_000);
    }
  });

  test("a bad cell on the helper's first line, the main thread's last, in a whole chunk or after the last: the same error at the same line and column", async () => {
    for (const line of [() => splitLine, () => splitLine - 1, () => wholeChunkLine, () => tailLine]) {
      const { alone, helped } = await both("split-bad-cell.csv", edited(line(), badVa), plain);
      expect(alone).toBeInstanceOf(AnalysisInputError);
      expect(helped).toEqual(alone);
      expect(helped).toMatchObject({ code: "non-numeric-cell", line: line(), column: 2 });
      expect((helped as Error).message).toBe((alone as Error).message);
    }
  });

  test("a value out of range after its scale inside a whole chunk the helper wrote: the same error at the same line and column", async () => {
    const line = wholeChunkLine;
    const huge = (l: string): string => {
      const cells = l.split(",");
      cells[2] = `1.${"0".repeat(cells[2]!.length - 5)}e22`; // Ia: 1e22 A × 1e90 is beyond 1e100
      return cells.join(",");
    };
    const { alone, helped } = await both("split-out-of-range.csv", edited(line, huge), { channels: { "Ia (A)": { scale: 1e90 } } });
    expect(alone).toBeInstanceOf(AnalysisInputError);
    expect(helped).toEqual(alone);
    expect(helped).toMatchObject({ code: "value-out-of-range", line, column: 3 });
  });

  test("a blank line before the split (the helper's row count is off: its part is set aside) or after it: identical results", async () => {
    const blank = (l: string): string => " ".repeat(l.length);
    const before = await both("split-blank-before.csv", edited(20_000, blank), plain);
    expect(before.helped).toEqual(before.alone);
    expect(before.helperRows).toBe(0);
    const after = await both("split-blank-after.csv", edited(wholeChunkLine, blank), plain);
    expect(after.helped).toEqual(after.alone);
    expect(after.helperRows).toBeGreaterThan(0);
  });

  test("a record longer than its head promised: the helper stops where the kept rows end, the rest is read twice", async () => {
    // The first 5,000 rows padded to ~200 bytes: the head promises ~43,000 rows, 150,000 may be kept.
    const { alone, helped, helperRows } = await both("split-padded-head.csv", captureText(30, 5_000), plain, { keepRowsBytes: 8 * 5 * 150_000 });
    expect(helped).toEqual(alone);
    expect(helperRows).toBeGreaterThan(0);
  });
});
