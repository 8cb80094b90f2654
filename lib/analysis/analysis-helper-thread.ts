// The analysis helper thread (see analysis-helper.ts): measures frequency segments (SegmentEstimator)
// and windows (WindowAnalyzer.measureWindow) of a record held in shared memory, for the main thread.
// Built as its own module by scripts/build-cli.mjs; started with `new Worker(...)`.
import { parentPort } from "node:worker_threads";
import type { HelperAnswer, HelperRequest, SentInputError } from "./analysis-helper";
import { CompactColumn, type CompactColumnData } from "./compact-column";
import { AnalysisInputError } from "./errors";
import { KeptRows } from "./kept-rows";
import { SegmentEstimator } from "./segment-estimator";
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
  if (!scratch || scratch.length < length) scratch = segmentScratch[e] = new Float64Array(length);
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
  const started = performance.now();
  const { channels, analyzerChannels, reference, shape, recordSamples, windowBounds, from, to, out } = request;
  const analyzer = new WindowAnalyzer(analyzerChannels, reference, shape, recordSamples, 1);
  const source = KeptRows.windowSource(channels, recordSamples);
  const length = analyzer.measurementLength;
  for (let w = from; w < to; w++) {
    analyzer.measureWindow(windowBounds[w]!, windowBounds[w + 1]! - windowBounds[w]!, source, out.subarray((w - from) * length, (w - from + 1) * length));
  }
  return { type: "windows", ms: performance.now() - started };
}

parentPort?.on("message", (request: HelperRequest) => {
  let reply: HelperAnswer | null;
  try {
    reply = answer(request);
  } catch (error) {
    reply = { type: "failed", message: describe(error) };
  }
  if (reply) parentPort!.postMessage(reply);
});
