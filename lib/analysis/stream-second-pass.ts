// Pass 2 of the streaming CSV analysis (see analyze-csv-file.ts): exact time-axis checks, clipping runs,
// the waveform excerpt, and the windows analysed from a ring buffer.
import { ChannelScan } from "./channel-scan";
import { WaveformCollector } from "./collect-waveform";
import { AnalysisInputError } from "./errors";
import { irregularStepError, offGridError } from "./fit-sample-interval";
import type { KeptRows } from "./kept-rows";
import { ROW_CHUNK, RowCollector, type RowSink } from "./row-collector";
import { WindowAnalyzer, type WindowSource } from "./window-analyzer";
import type { WindowClaims } from "./window-claims";

const NO_ROWS = new Float64Array(0);

/** Pass 2 sink: exact time-axis checks, clipping runs, the waveform excerpt, and windows from a ring buffer. */
export class SecondPass implements RowSink, WindowSource {
  filled = 0;
  windowsMs = 0;
  private readonly rings: Float64Array[];
  private readonly mask: number;
  private readonly checks: SecondPassChecks;
  /** The next window to analyse (after pass 2: the windows this thread measured). */
  window = 0;
  /** Windows below this are measured here: all of them, or (shared with the helper thread) those claimed from the front. */
  private windowLimit: number;

  constructor(
    collector: () => RowCollector,
    private readonly scans: ChannelScan[],
    private readonly analyzer: WindowAnalyzer,
    /** Window boundaries in samples (see scheduleWindows). */
    private readonly windowBounds: Float64Array,
    private readonly recordSamples: number,
    private readonly padding: number,
    private readonly span: number,
    timeCheck: TimeCheck | null,
    private readonly waveform: WaveformCollector | null,
    /** Shared with the analysis helper thread, which takes windows from the back: each window here is claimed first. */
    private readonly claims: WindowClaims | null = null,
  ) {
    this.windowLimit = windowBounds.length - 1;
    // Holds the pending window, one period folded back, and one incoming chunk.
    let capacity = 1;
    while (capacity < ROW_CHUNK + 3 * span + 16) capacity *= 2;
    this.mask = capacity - 1;
    this.rings = scans.map(() => new Float64Array(capacity));
    this.checks = new SecondPassChecks(collector, scans, timeCheck);
  }

  /** The first time stamp off the regular grid (reported after pass 2: a step error found later wins). */
  get residualError(): AnalysisInputError | null {
    return this.checks.residualError;
  }

  accept(timesS: Float64Array | null, values: Float64Array[], count: number, firstRow: number): void {
    this.checks.check(timesS, values, count, firstRow);
    for (let c = 0; c < this.scans.length; c++) {
      const ring = this.rings[c]!;
      const source = values[c]!;
      const mask = this.mask;
      for (let r = 0; r < count; r++) ring[(firstRow + r) & mask] = source[r]!;
    }
    this.waveform?.add(values, count, firstRow);
    this.filled = firstRow + count;
    this.drain();
  }

  /** Analyses every window whose samples (with padding) are all in. */
  drain(): void {
    const { windowBounds, analyzer } = this;
    const available = Math.min(this.filled, this.recordSamples);
    const started = performance.now();
    while (this.window < this.windowLimit) {
      const start = windowBounds[this.window]!;
      if (Math.min(Math.floor(start) - this.padding + this.span, this.recordSamples) > available) break;
      if (this.claims && this.claims.takeFront() !== this.window) {
        // The helper thread has taken this window and every later one.
        this.windowLimit = this.window;
        break;
      }
      analyzer.addWindow(start, windowBounds[this.window + 1]! - start, this);
      this.window++;
    }
    this.windowsMs += performance.now() - started;
  }

  copyWindow(channel: number, first: number, span: number, period: number, target: Float64Array): void {
    const ring = this.rings[channel]!;
    const { mask } = this;
    const n = this.recordSamples;
    for (let k = 0; k < span; k++) {
      let j = first + k;
      while (j < 0) j += period;
      while (j >= n) j -= period;
      if (j < 0) j = 0;
      target[k] = ring[j & mask]!;
    }
  }
}

/** The whole-record time fit pass 2 checks every stamp against (see fitSampleInterval). */
export interface TimeCheck {
  intervalS: number;
  startS: number;
  toleranceS: number;
  /** The time column (1-based), for messages. */
  column: number;
}

/**
 * Pass 2's checks of each row, in row order: the time axis against the whole-record fit
 * (fitSampleInterval's step and residual checks) and each channel's clipping runs against its
 * extremes. {@link SecondPass} runs them on the rows it is handed; with the rows kept,
 * {@link checkKept} runs them over the kept columns alone.
 *
 * Complexity O(rows × channels).
 *
 * @example
 * const checks = new SecondPassChecks(() => collector, scans, timeCheck); checks.check(times, values, count, firstRow);
 */
export class SecondPassChecks {
  residualError: AnalysisInputError | null = null;
  private previousTimeS = Number.NaN;

  constructor(
    private readonly collector: () => RowCollector,
    private readonly scans: ChannelScan[],
    private readonly timeCheck: TimeCheck | null,
  ) {
    // The stores after the loops, run once on no rows (see ChannelScan's constructor).
    this.check(NO_ROWS, scans.map(() => NO_ROWS), 0, 0);
  }

  /** Checks the next `count` rows (row `firstRow` on). @throws AnalysisInputError at the first irregular step. */
  check(timesS: Float64Array | null, values: Float64Array[], count: number, firstRow: number): void {
    if (timesS && this.timeCheck) this.checkTimes(timesS, count, firstRow);
    for (let c = 0; c < this.scans.length; c++) this.scans[c]!.countClipped(values[c]!, count);
  }

  /**
   * Checks the `rows` kept rows chunk by chunk (decoded into arrays reused for each) and returns
   * the error an irregular step raises, rather than throwing it (the caller throws it where pass 2
   * would have), or null.
   */
  checkKept(kept: KeptRows, rows: number): AnalysisInputError | null {
    const times = kept.times && this.timeCheck ? new Float64Array(ROW_CHUNK) : null;
    const channels = kept.channels.map(() => new Float64Array(ROW_CHUNK));
    try {
      for (let first = 0; first < rows; first += ROW_CHUNK) {
        const end = Math.min(rows, first + ROW_CHUNK);
        if (times) kept.times!.decode(first, end, times);
        kept.channels.forEach((column, c) => column.decode(first, end, channels[c]!));
        this.check(times, channels, end - first, first);
      }
    } catch (error) {
      if (error instanceof AnalysisInputError) return error;
      throw error;
    }
    return null;
  }

  /** fitSampleInterval's step and residual checks against the whole-record fit; the first step error wins over any residual error. */
  private checkTimes(timesS: Float64Array, count: number, firstRow: number): void {
    const { intervalS, startS, toleranceS, column } = this.timeCheck!;
    let previous = this.previousTimeS;
    for (let r = 0; r < count; r++) {
      const i = firstRow + r;
      const t = timesS[r]!;
      if (i > 0) {
        const step = t - previous;
        if (Math.abs(step - intervalS) > toleranceS) {
          throw irregularStepError(this.collector().lineOfRow(i), column, step, intervalS);
        }
      }
      const residual = Math.abs(t - (startS + intervalS * i));
      if (residual > toleranceS && !this.residualError) {
        this.residualError = offGridError(this.collector().lineOfRow(i), column, t, residual, intervalS);
      }
      previous = t;
    }
    this.previousTimeS = previous;
  }
}
