// The command line's fast path against the worker's own functions: a capture long enough for the
// streaming analysis (more than two frequency segments) whose rows are kept in shared memory, run
// through the real `npm run analyze -- … --json` with its analysis helper thread forced on (it then
// parses the later part of the file, measures the segments and the windows from the back while the
// main thread measures the windows from the front), and with it forced off, must give the very
// numbers the worker's one-thread pipeline (runCaptureAnalysis + runCaptureEvaluation, called here
// in-process) gives; and a bad cell where the helper's part starts, the very error.
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, test } from "vitest";
import { writeLines } from "@/fixtures/write-lines";
import { KEEP_ROWS_BYTES } from "@/lib/analysis/analyze-csv-file";
import { helperPartStart } from "@/lib/analysis/helper-part-start";
import { FREQUENCY_SEGMENT_SAMPLES } from "@/lib/analysis/segment-bounds";
import { parseAnalyzeArgs } from "@/lib/pipeline/parse-analyze-args";
import { runCaptureAnalysis } from "@/lib/pipeline/run-capture-analysis";
import { runCaptureEvaluation } from "@/lib/pipeline/run-capture-evaluation";
import { seedLimitSetRevision } from "@/lib/pipeline/seed-limit-set-revision";
import { runAnalyzeCli, withoutDatabase } from "@/tests/support/run-analyze-cli";

const RATE_HZ = 25_600;
const SECONDS = 21;
const ROWS = RATE_HZ * SECONDS;
const COLUMNS = 5;
/** Generating, two CLI runs and the in-process run; the machine is shared. */
const SLOW = 240_000;

let dir: string;
let file: string;

/**
 * Time, Va, Ia, Vb, Ib at 25.6 kS/s for 21 s: the fundamental ramps 49.9 → 50.1 Hz, Ia carries a
 * third harmonic that bursts from 1.5 A to 4.0 A r.m.s. between 10 s and 13 s (so the time rules
 * decide), fixed decimals as recorders print them (with "-0.000" where a value rounds to zero).
 */
async function writeCapture(target: string): Promise<void> {
  const b = (-2 * Math.PI) / 3;
  await writeLines(target, "Time (s),Va (V),Ia (A),Vb (V),Ib (A)\n", ROWS, (k) => {
    const t = k / RATE_HZ;
    const phase = 2 * Math.PI * (49.9 * t + (0.2 * t * t) / (2 * SECONDS));
    const h3 = t >= 10 && t < 13 ? 4.0 : 1.5;
    const va = 325 * Math.cos(phase) + 6 * Math.cos(5 * phase + 0.3);
    const vb = 325 * Math.cos(phase + b) + 6 * Math.cos(5 * (phase + b) + 0.3);
    const ia = Math.SQRT2 * (8 * Math.cos(phase - 0.2) + h3 * Math.cos(3 * phase + 0.4)) + 0.6 * Math.cos(11 * phase);
    const ib = Math.SQRT2 * (8 * Math.cos(phase + b - 0.2) + 1.5 * Math.cos(3 * (phase + b) + 0.4));
    return `${t.toFixed(7)},${va.toFixed(2)},${ia.toFixed(3)},${vb.toFixed(2)},${ib.toFixed(3)}\n`;
  });
}

beforeAll(async () => {
  dir = mkdtempSync(path.join(os.tmpdir(), "ordwise-cli-helper-"));
  file = path.join(dir, "drifting-bursting-21s.csv");
  await writeCapture(file);
}, SLOW);
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe("the CLI's streaming path with its helper thread gives the worker's numbers", () => {
  const argv = () => [file, "--json", "--limits", "iec-61000-3-2-class-a", "--start", "2024-03-04T12:00:00Z"];

  test("the capture takes the streaming path with its rows kept (the helper thread's path)", () => {
    expect(ROWS).toBeGreaterThan(2 * FREQUENCY_SEGMENT_SAMPLES);
    expect(8 * COLUMNS * ROWS).toBeLessThanOrEqual(KEEP_ROWS_BYTES);
  });

  test("helper thread on and off: JSON identical to the worker's one-thread pipeline, number for number", async () => {
    const request = parseAnalyzeArgs(argv());
    const { analysis } = await runCaptureAnalysis(file, request.mapping, request.context);
    const compliance = runCaptureEvaluation(analysis, seedLimitSetRevision("iec-61000-3-2-class-a"), request.context, request.recordStartMs);
    const worker = JSON.parse(JSON.stringify({ file, ...analysis, compliance, limitSetSource: "seed-files" })) as unknown;
    // The burst decides, so the comparison covers the time rules too (IEC 61000-3-2 Class A h3, 2.30 A; its 150 % rule).
    const ia = compliance.channels.find((c) => c.channel === "Ia (A)")!;
    expect(ia.rows.find((r) => r.order === 3)).toMatchObject({ verdict: "fail", decidedBy: "smoothed-max" });
    for (const setting of ["on", "off"]) {
      const cli = runAnalyzeCli(argv(), { env: { ...withoutDatabase(), ORDWISE_ANALYSIS_HELPER: setting }, timeoutMs: 120_000 });
      expect(cli.stderr).toBe("");
      expect(cli.status).toBe(0);
      expect(JSON.parse(cli.stdout), `helper ${setting}`).toEqual(worker);
    }
  }, SLOW);

  test("a bad cell on the first line of the helper's part: the same error at the same line and column, helper on and off", () => {
    const text = readFileSync(file, "latin1"); // ASCII: one character per byte
    const from = helperPartStart(file, text.length);
    expect(from).not.toBeNull();
    const end = text.indexOf("\n", from!);
    const line = text.slice(0, from!).split("\n").length;
    const changed = text.slice(from!, end).replace(/,(-?)\d/, ",$1x");
    const badFile = path.join(dir, "bad-cell-at-split.csv");
    writeFileSync(badFile, text.slice(0, from!) + changed + text.slice(end), "latin1");
    const cell = changed.split(",")[1]!;
    for (const setting of ["on", "off"]) {
      const cli = runAnalyzeCli([badFile, "--json"], { env: { ...withoutDatabase(), ORDWISE_ANALYSIS_HELPER: setting }, timeoutMs: 120_000 });
      expect(cli.status, `helper ${setting}`).toBe(1);
      expect(cli.stderr, `helper ${setting}`).toBe(`error: ${badFile}: non-numeric cell at line ${line}, column 2 (Va (V)): "${cell}", not a number\n`);
    }
  }, SLOW);
});
