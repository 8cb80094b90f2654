// The analysis helper thread (see analysis-helper.ts): parses the later part of a file (parsePart),
// measures frequency segments (SegmentEstimator) and windows (WindowAnalyzer.measureWindow) of a
// record held in shared memory, for the main thread.
// Built as its own module by scripts/build-cli.mjs; started with `new Worker(...)`.
import { parentPort } from "node:worker_threads";
import type { HelperAnswer, HelperRequest, SentInputError } from "./analysis-helper";
import { CompactColumn, type CompactColumnData } from "./compact-column";
import { arrayWindowSource } from "./array-window-source";
import { AnalysisInputError } from "./errors";
import { getFft } from "./get-fft";
import { KeptRows } from "./kept-rows";
import { PlainLineScanner } from "./plain-line-scanner";
import { ROW_CHUNK } from "./row-collector";
import { countLinesBefore } from "./count-lines-before";
import { parsePart } from "./parse-part";
import { SegmentEstimator } from "./segment-estimator";
import { WindowClaims } from "./window-claims";
import { WindowAnalyzer } from "./window-analyzer";

function send(value: number | AnalysisInputError): number | SentInputError {
  if (typeof value === "number") return value;
  const { code, message, line, column } = value;
  return { error: { code, message, ...(line !== undefined ? { line } : {}), ...(column !== undefined ? { column } : {}) } };
}

let estimator: SegmentEstimator | null = null;
/** A segment that failed before the last one (only the last is answered). */
let segmentFailure: string | null = null;

function describe(error: unknown): string {
  return error instanceof Error ? (error.stack ?? error.message) : String(error);
}

/** Per estimation channel, the segment unpacked (reused from segment to segment). */
const segmentScratch: Float64Array[] = [];

function unpacked(e: number, data: CompactColumnData, start: number, length: number): Float64Array {
  let scratch = segmentScratch[e];
  // Room for the last segment too (up to two segments long); only the pages used are mapped.
  if (!scratch || scratch.length < length) scratch = segmentScratch[e] = new Float64Array(2 * length);
  CompactColumn.from(data).decode(start, start + length, scratch);
  return scratch.subarray(0, length);
}

function measureSegment(request: Extract<HelperRequest, { type: "segment" }>): HelperAnswer | null {
  const { channels, provisionalRateHz, start, length, first, last } = request;
  if (first || !estimator) {
    estimator = new SegmentEstimator(channels.length);
    segmentFailure = null;
  }
  if (segmentFailure === null) {
    try {
      estimator.estimate(
        channels.map((data, e) => unpacked(e, data, start, length)),
        length,
        provisionalRateHz,
      );
    } catch (error) {
      segmentFailure = describe(error);
    }
  }
  if (!last) return null;
  const done = estimator;
  estimator = null;
  if (segmentFailure !== null) return { type: "failed", message: segmentFailure };
  return { type: "estimates", ratios: done.ratios.map((list) => list.map(send)), tracks: done.trackers.map((t) => t.finish()), fundamentalMs: done.fundamentalMs };
}

/** Bytes per memory page touched by prefault (4 KiB: the smallest common page). */
const PAGE_BYTES = 4096;

/**
 * Touches every page of the arrays with an atomic add of zero (see AnalysisHelper.prefault), in
 * the order the main thread fills them: row by row across the arrays.
 */
function prefault(arrays: Float64Array[]): void {
  const words = arrays.map((a) => new Int32Array(a.buffer, a.byteOffset, a.length * 2));
  const longest = Math.max(0, ...words.map((w) => w.length));
  for (let i = 0; i < longest; i += PAGE_BYTES / 4) {
    for (const w of words) if (i < w.length) Atomics.add(w, i, 0);
  }
}

function answer(request: HelperRequest): HelperAnswer | null {
  if (request.type === "prefault") {
    try {
      prefault(request.arrays);
    } catch {
      // Touching pages only saves time; the main thread writes them either way.
    }
    return null;
  }
  if (request.type === "segment") return measureSegment(request);
  if (request.type === "part") return { type: "part", ...parsePart(request) };
  if (request.type === "count") {
    countedAhead = true;
    try {
      countLinesBefore(request.path);
    } catch {
      // Counting ahead only saves time; the part counts again if need be.
    }
    return null;
  }
  const started = performance.now();
  const { channels, analyzerChannels, reference, shape, recordSamples, windowBounds, out } = request;
  const analyzer = new WindowAnalyzer(analyzerChannels, reference, shape, recordSamples, 1);
  const source = KeptRows.windowSource(channels, recordSamples);
  const length = analyzer.measurementLength;
  const claims = new WindowClaims(request.claims);
  let from = windowBounds.length - 1;
  for (let w = claims.takeBack(); w >= 0; w = claims.takeBack()) {
    analyzer.measureWindow(windowBounds[w]!, windowBounds[w + 1]! - windowBounds[w]!, source, out.subarray(w * length, (w + 1) * length));
    from = w;
  }
  return { type: "windows", ms: performance.now() - started, from };
}

// --- Warming up -------------------------------------------------------------------------------------
// The thread is started before the main thread has rows for it (about half a second on a typical
// capture). Meanwhile it runs its measuring once on a made-up record, so that its code is compiled
// and the coarse transform's tables are built when the first segment arrives. Each step runs only
// while no request is being served, and the steps stop at the first segment or windows. The tables
// are those every segment of the default length uses (the same numbers either way); the made-up
// results are dropped.

/** Samples per second and fundamental of the made-up record (a common recorder setting). */
const WARM_RATE_HZ = 25_600;
const WARM_HZ = 50;
/** Samples in a frequency segment by default (FREQUENCY_SEGMENT_SAMPLES). */
const WARM_SEGMENT = 1 << 18;
let warming = true;
/** A file's lines were counted ahead (AnalysisHelper.countAhead): its part is to come. */
let countedAhead = false;

function madeUpSamples(length = WARM_SEGMENT): Float64Array {
  const samples = (segmentScratch[0] ??= new Float64Array(2 * WARM_SEGMENT)).subarray(0, length);
  for (let k = 0; k < length; k++) {
    const phase = (2 * Math.PI * WARM_HZ * k) / WARM_RATE_HZ;
    samples[k] = 325 * Math.cos(phase) + 8 * Math.cos(5 * phase);
  }
  return samples;
}

/** Made-up lines as a recorder prints them (time, two voltages, two currents), as UTF-8 bytes. */
function madeUpLines(count: number): Uint8Array {
  let text = "";
  for (let k = 0; k < count; k++) {
    const phase = (2 * Math.PI * WARM_HZ * k) / WARM_RATE_HZ;
    text += `${(k / WARM_RATE_HZ).toFixed(7)},${(325 * Math.cos(phase)).toFixed(2)},${(8 * Math.cos(phase)).toFixed(3)},${(325 * Math.sin(phase)).toFixed(2)},${(-8 * Math.sin(phase)).toFixed(3)}\n`;
  }
  return new TextEncoder().encode(text);
}

const warmUpSteps: (() => void)[] = [
  // Parsing a part (parsePart): the scanner and writing whole chunks (kept small: a part asked for
  // waits until a step is done).
  () => {
    const bytes = madeUpLines(512);
    const channels = [0, 1, 2, 3].map(() => new Float64Array(ROW_CHUNK));
    const times = new Float64Array(ROW_CHUNK);
    const scanner = new PlainLineScanner({ columnCount: 5, delimiterCode: 44, decimalCode: 46, channelSlots: Int32Array.from([1, 2, 3, 4]), timeSlot: 0, timeToBase: 1 }, channels, times);
    const column = new CompactColumn(new ArrayBuffer(8 * ROW_CHUNK), ROW_CHUNK);
    for (let round = 0; round < 4; round++) {
      scanner.scan(bytes, 0, bytes.length, 0, ROW_CHUNK);
      column.append(times, 512, false);
      column.resumeAt(0);
    }
  },
  () => void getFft(WARM_SEGMENT / 2),
  () => {
    const windowSamples = (10 * WARM_RATE_HZ) / WARM_HZ;
    const samples = madeUpSamples(6 * windowSamples);
    const shape = { cycles: 10, points: 4096, orders: 50, maxOrder: 50, resolvableOrder: 50, thdMaxOrder: 50, halfWidth: 8, padding: 12, span: windowSamples + 2 * 12 + 2 };
    const channels = ["voltage", "current"].map((quantity) => ({ name: quantity, quantity: quantity as "voltage" | "current", phase: "a" as const, scale: 1 }));
    const analyzer = new WindowAnalyzer(channels, 0, shape, samples.length, 1);
    const source = arrayWindowSource([{ samples, scale: 1 }, { samples, scale: 0.05 }], samples.length);
    const out = new Float64Array(analyzer.measurementLength);
    for (let w = 1; w <= 4; w++) analyzer.measureWindow(w * windowSamples + 0.3, windowSamples, source, out);
  },
  // The longest step (~0.2 s): not when a file's lines are being counted ahead, as its part is then
  // asked for soon and would wait for it.
  () => {
    if (!countedAhead) new SegmentEstimator(1).estimate([madeUpSamples()], WARM_SEGMENT, WARM_RATE_HZ);
  },
];

function warmUp(): void {
  const step = warmUpSteps.shift();
  if (!warming || !step) return;
  try {
    step();
  } catch {
    // Warming up only saves time.
  }
  setImmediate(warmUp);
}
setImmediate(warmUp);

parentPort?.on("message", (request: HelperRequest) => {
  if (request.type !== "prefault" && request.type !== "count") warming = false;
  let reply: HelperAnswer | null;
  try {
    reply = answer(request);
  } catch (error) {
    reply = { type: "failed", message: describe(error) };
  }
  if (reply) parentPort!.postMessage(reply);
});
