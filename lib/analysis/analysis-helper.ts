// A second thread for the streaming analysis of a record whose rows pass 1 keeps (analyze-csv-file.ts):
// it measures the frequency segments while pass 1 is still parsing, and half of the windows while
// pass 2 measures the other half. It runs the same functions on the same numbers (read from shared
// memory), so the result is the same as in one thread, number for number.
import { existsSync } from "node:fs";
import { availableParallelism, loadavg } from "node:os";
import { fileURLToPath } from "node:url";
import { Worker } from "node:worker_threads";
import { AnalysisInputError, type AnalysisErrorCode } from "./errors";
import type { CompactColumnData } from "./compact-column";
import type { PartRequest, PartResult } from "./parse-part";
import type { PhaseTrack } from "./phase-tracker";
import type { AnalyzerChannel, WindowShape } from "./window-types";

/** An AnalysisInputError as it crosses between threads. */
export interface SentInputError {
  error: { code: AnalysisErrorCode; message: string; line?: number; column?: number };
}

/** What the main thread asks of the helper thread (in order; answered in order, where answered). */
export type HelperRequest =
  | ({ type: "part" } & PartRequest)
  | {
      type: "count";
      /** A file about to be analysed: its lines before the helper's part are counted ahead (countLinesBefore). Not answered. */
      path: string;
    }
  | {
      type: "prefault";
      /** SharedArrayBuffer-backed arrays the main thread is about to fill (see {@link AnalysisHelper.prefault}). Not answered. */
      arrays: Float64Array[];
    }
  | {
      type: "segment";
      /** The estimation channels as kept (in shared memory), holding at least the segment's rows. */
      channels: CompactColumnData[];
      /** f is measured as f / rate; the rate is the provisional one pass 1 fits on its look-ahead. */
      provisionalRateHz: number;
      /** Segment [start, start + length) of the record; segments come in order. */
      start: number;
      length: number;
      /** The record's first segment: measuring starts afresh. */
      first: boolean;
      /** The record's last segment: answered with every segment's estimates (the others are not answered). */
      last: boolean;
    }
  | {
      type: "windows";
      /** Every channel as kept (in shared memory), `recordSamples` rows. */
      channels: CompactColumnData[];
      analyzerChannels: AnalyzerChannel[];
      reference: number;
      shape: WindowShape;
      recordSamples: number;
      windowBounds: Float64Array;
      /** The windows' claims (WindowClaims.cell): the helper takes windows from the back until none is left. */
      claims: BigInt64Array;
      /** Window w's measurement goes to numbers w × measurementLength … (SharedArrayBuffer-backed). */
      out: Float64Array;
    };

/** The helper thread's answers. */
export type HelperAnswer =
  | ({ type: "part" } & PartResult)
  | { type: "estimates"; ratios: (number | SentInputError)[][]; tracks: PhaseTrack[]; fundamentalMs: number }
  | { type: "windows"; ms: number; /** The first window it measured (the window count when none). */ from: number }
  | { type: "failed"; message: string };

/** Pass 1's measuring, as the helper thread returns it. */
export interface SegmentResults {
  ratios: (number | AnalysisInputError)[][];
  tracks: PhaseTrack[];
  fundamentalMs: number;
}

/** The AnalysisInputError sent across, or the number. */
export function receiveRatio(value: number | SentInputError): number | AnalysisInputError {
  if (typeof value === "number") return value;
  const { code, message, line, column } = value.error;
  return new AnalysisInputError(code, message, { ...(line !== undefined ? { line } : {}), ...(column !== undefined ? { column } : {}) });
}

/**
 * The main thread's end of an analysis helper thread (see analysis-helper-thread.ts). One helper
 * serves one analysis at a time; the command line starts one for all its files and closes it at
 * the end. Requests are answered in order.
 *
 * @example
 * const helper = AnalysisHelper.start(new URL("./analysis-helper-thread.mjs", import.meta.url));
 * try { await analyzeCsvFile(path, options, undefined, { helper }); } finally { await helper?.close(); }
 */
export class AnalysisHelper {
  private readonly pending: { resolve: (answer: HelperAnswer) => void; reject: (error: Error) => void }[] = [];
  private failure: Error | null = null;

  private constructor(private readonly worker: Worker) {
    worker.on("message", (answer: HelperAnswer) => {
      const waiting = this.pending.shift();
      if (!waiting) return;
      if (answer.type === "failed") waiting.reject(new Error(`analysis helper thread: ${answer.message}`));
      else waiting.resolve(answer);
    });
    const fail = (error: Error): void => {
      this.failure = error;
      for (const waiting of this.pending.splice(0)) waiting.reject(error);
    };
    worker.on("error", fail);
    worker.on("exit", (code) => fail(new Error(`analysis helper thread exited (${code})`)));
  }

  /**
   * Whether a second thread would run on a core of its own: the machine has two or more and its
   * load over the last minute leaves at least half a core idle. On a busy machine the helper
   * only adds work (its own start-up, code compiled twice) for the same result.
   */
  static wouldHelp(): boolean {
    const cores = availableParallelism();
    return cores >= 2 && loadavg()[0]! < cores - 0.5;
  }

  /**
   * Starts the helper thread from its built module (`entry`, JavaScript), or returns null when
   * there is none (then the analysis runs in one thread, with the same result).
   */
  static start(entry: URL): AnalysisHelper | null {
    if (!existsSync(fileURLToPath(entry))) return null;
    return new AnalysisHelper(new Worker(entry));
  }

  private ask(request: HelperRequest): Promise<HelperAnswer> {
    if (this.failure) return Promise.reject(this.failure);
    return new Promise<HelperAnswer>((resolve, reject) => {
      this.pending.push({ resolve, reject });
      this.worker.postMessage(request);
    });
  }

  /**
   * Sends segment [start, start + length) of `channels` (estimation channels, shared) to be
   * measured; its samples must be in place and stay unchanged. Segments of a record go in order,
   * the first with `first`, the last with `last`: that one resolves to every segment's estimates.
   */
  sendSegment(segment: Omit<Extract<HelperRequest, { type: "segment" }>, "type">): Promise<SegmentResults> | null {
    const request: HelperRequest = { type: "segment", ...segment };
    if (!segment.last) {
      if (!this.failure) this.worker.postMessage(request);
      return null;
    }
    return this.ask(request).then((a) => {
      if (a.type !== "estimates") throw new Error(`analysis helper thread answered ${a.type} to a segment`);
      return { ratios: a.ratios.map((list) => list.map(receiveRatio)), tracks: a.tracks, fundamentalMs: a.fundamentalMs };
    });
  }

  /**
   * Has the helper parse the later part of a file into the kept columns (see parsePart) while this
   * thread parses the earlier part.
   */
  async parsePart(request: PartRequest): Promise<PartResult> {
    const answer = await this.ask({ type: "part", ...request });
    if (answer.type !== "part") throw new Error(`analysis helper thread answered ${answer.type} to a part`);
    return answer;
  }

  /**
   * Has the helper count the lines of `path` before the part it would parse (countLinesBefore)
   * while it has nothing else to do, so that parsing it later starts at once.
   */
  countAhead(path: string): void {
    if (!this.failure) this.worker.postMessage({ type: "count", path } satisfies HelperRequest);
  }

  /**
   * Has the helper touch every memory page of `arrays` (shared, about to be filled by this thread)
   * ahead of this thread, so that the operating system maps them there, in parallel, rather than
   * here on first write. Each page gets an atomic add of zero to one of its words, which leaves
   * whatever this thread has written, or writes meanwhile, unchanged.
   */
  prefault(arrays: Float64Array[]): void {
    if (!this.failure) this.worker.postMessage({ type: "prefault", arrays } satisfies HelperRequest);
  }

  /**
   * Measures windows from the back into `out` (see WindowAnalyzer.measureWindow), claiming each
   * from `claims` first, until none is left; resolves to the first window it measured.
   */
  async measureWindows(request: Omit<Extract<HelperRequest, { type: "windows" }>, "type">): Promise<number> {
    const answer = await this.ask({ type: "windows", ...request });
    if (answer.type !== "windows") throw new Error(`analysis helper thread answered ${answer.type} to windows`);
    return answer.from;
  }

  /** Stops the thread. */
  async close(): Promise<void> {
    this.worker.removeAllListeners("exit");
    await this.worker.terminate();
  }
}
