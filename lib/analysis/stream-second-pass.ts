// Pass 2 of the streaming CSV analysis (see analyze-csv-file.ts): exact time-axis checks, clipping runs,
// the waveform excerpt, and the windows analysed from a ring buffer.
import { ChannelScan } from "./channel-scan";
import { WaveformCollector } from "./collect-waveform";
import { AnalysisInputError } from "./errors";
import { ROW_CHUNK, RowCollector, type RowSink } from "./row-collector";
import { WindowAnalyzer, type WindowSource } from "./window-analyzer";
import type { WindowClaims } from "./window-claims";

/** Said after every irregular-time-axis message: the tolerance the checks allow. */
export const STEP_MESSAGE = "(tolerance ±50 % of the interval plus the stamps' printed resolution)";

/** Pass 2 sink: exact time-axis checks, clipping runs, the waveform excerpt, and windows from a ring buffer. */
export class SecondPass implements RowSink, WindowSource {
  filled = 0;
  windowsMs = 0;
  residualError: AnalysisInputError | null = null;
  private readonly rings: Float64Array[];
  private readonly mask: number;
  private previousTimeS = Number.NaN;
  /** The next window to analyse (after pass 2: the windows this thread measured). */
  window = 0;
  /** Windows below this are measured here: all of them, or (shared with the helper thread) those claimed from the front. */
  private windowLimit: number;

  constructor(
    private readonly collector: () => RowCollector,
    private readonly scans: ChannelScan[],
    private readonly analyzer: WindowAnalyzer,
    /** Window boundaries in samples (see scheduleWindows). */
    private readonly windowBounds: Float64Array,
    private readonly recordSamples: number,
    private readonly padding: number,
    private readonly span: number,
    private readonly timeCheck: { intervalS: number; startS: number; toleranceS: number; column: number } | null,
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
  }

  accept(timesS: Float64Array | null, values: Float64Array[], count: number, firstRow: number): void {
    if (timesS && this.timeCheck) this.checkTimes(timesS, count, firstRow);
    for (let c = 0; c < this.scans.length; c++) {
      this.scans[c]!.countClipped(values[c]!, count);
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
          const line = this.collector().lineOfRow(i);
          throw new AnalysisInputError(
            "irregular-time",
            `irregular time axis at line ${line}: step of ${step.toPrecision(4)} s where the interval is ${intervalS.toPrecision(4)} s ${STEP_MESSAGE}`,
            { line, column },
          );
        }
      }
      const residual = Math.abs(t - (startS + intervalS * i));
      if (residual > toleranceS && !this.residualError) {
        const line = this.collector().lineOfRow(i);
        this.residualError = new AnalysisInputError(
          "irregular-time",
          `irregular time axis at line ${line}: time stamp ${t} s is ${residual.toPrecision(3)} s off the regular grid of ${intervalS.toPrecision(4)} s ${STEP_MESSAGE}`,
          { line, column },
        );
      }
      previous = t;
    }
    this.previousTimeS = previous;
  }
}
