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
import { analyzeCsvFile } from "@/lib/analysis/analyze-csv-file";
import { AnalysisInputError } from "@/lib/analysis/errors";
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
