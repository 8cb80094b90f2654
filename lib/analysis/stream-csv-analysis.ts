// Analyses a CSV file on disk in two streaming passes, with memory that does not grow with the
// record: pass 1 parses and checks every row and tracks the fundamental (per segment, per block); pass 2
// parses again and analyses each window from a ring buffer as soon as its samples are in.
import { analyzeImported } from "./analyze-imported";
import type { StageTimings } from "./analyze-samples";
import { checkOptions } from "./check-options";
import { assembleAnalysisResult } from "./assemble-analysis-result";
import { ChannelScan } from "./channel-scan";
import { chooseSampleInterval } from "./choose-sample-interval";
import { WaveformCollector } from "./collect-waveform";
import { AnalysisInputError } from "./errors";
import { estimateFundamental } from "./estimate-fundamental";
import { backwardsTimeError } from "./fit-sample-interval";
import { checkOverrides, finishImport, MemorySink, type ImportOptions } from "./import-csv";
import { intervalFromPreamble } from "./interval-from-preamble";
import { LineFit } from "./line-fit";
import { planColumns, type ColumnPlan } from "./plan-columns";
import { PhaseTracker } from "./phase-tracker";
import { planWindows } from "./plan-windows";
import { readCsvHead, readCsvRows } from "./read-csv-rows";
import { ROW_CHUNK, RowCollector, type RowSink } from "./row-collector";
import { FREQUENCY_SEGMENT_SAMPLES, segmentBounds } from "./segment-bounds";
import type { AnalysisOptions, AnalysisResult } from "./types";
import { WindowAnalyzer, type WindowSource } from "./window-analyzer";

/** Timings of the streaming path: pass 1 is `importMs`; pass 2's parsing is `rereadMs`. */
export interface StreamTimings extends StageTimings {
  /** Pass 2 minus the time spent in windows: re-parsing, time-axis and clipping checks. */
  rereadMs?: number;
}

const STEP_MESSAGE = "(tolerance ±50 % of the interval plus the stamps' printed resolution)";

interface PendingError {
  row: number;
  error: AnalysisInputError;
}

/**
 * Pass 1 sink. Keeps rows in memory up to the look-ahead (two frequency segments); a file that
 * ends within it is analysed by the in-memory path (identical results). Beyond it, switches to
 * streaming: time-axis fit and monotonic/step checks, per-channel extremes and r.m.s., and the
 * fundamental of each finished segment of the estimation channels, whose phase is then tracked
 * through that segment (the windows' boundaries come from the reference channel's track).
 */
class FirstPass implements RowSink {
  memory: MemorySink | null;
  streaming = false;
  /** Least-squares line t = start + interval·row over the whole time column. */
  readonly fit = new LineFit();
  firstTimeS = Number.NaN;
  rows = 0;
  readonly scans: ChannelScan[];
  /** f / provisional rate per segment, per estimation channel (errors kept, thrown if that channel is the reference). */
  readonly ratios: (number | AnalysisInputError)[][];
  /** The fundamental's phase through the record, per estimation channel (fed segment by segment, as the in-memory path does). */
  readonly trackers: PhaseTracker[];
  fundamentalMs = 0;
  private provisionalRateHz = 0;
  private previousTimeS = Number.NaN;
  monotonicError: PendingError | null = null;
  stepError: { row: number; stepS: number } | null = null;
  private readonly segmentBuffers: Float64Array[];
  private segmentFill = 0;

  constructor(
    private readonly collector: () => RowCollector,
    private readonly channelCount: number,
    private readonly hasTime: boolean,
    /** Indices of the channels whose fundamental is measured (the first voltage, else every current). */
    readonly estimation: number[],
    private readonly segmentSamples: number,
    private readonly statedIntervalS: number | null,
    private readonly timeColumn: number,
  ) {
    this.memory = new MemorySink(channelCount, hasTime, 2 * segmentSamples + ROW_CHUNK);
    this.scans = Array.from({ length: channelCount }, () => new ChannelScan());
    this.ratios = estimation.map(() => []);
    this.trackers = estimation.map(() => new PhaseTracker());
    this.segmentBuffers = estimation.map(() => new Float64Array(2 * segmentSamples));
  }

  accept(timesS: Float64Array | null, values: Float64Array[], count: number, firstRow: number): void {
    this.rows = firstRow + count;
    if (this.memory) {
      this.memory.accept(timesS, values, count);
      if (this.rows > 2 * this.segmentSamples && this.channelCount > 0) this.switchToStreaming();
      return;
    }
    this.stream(timesS, values, count, firstRow);
  }

  private switchToStreaming(): void {
    const memory = this.memory!;
    this.memory = null;
    this.streaming = true;
    const rows = this.rows;
    const times = memory.times?.values() ?? null;
    // Provisional rate (the segments' band search only): a fit over the look-ahead, else the stated interval.
    if (times) {
      const fit = new LineFit();
      for (let r = 0; r < rows; r++) fit.add(r, times[r]!);
      this.provisionalRateHz = 1 / fit.slope();
    } else {
      this.provisionalRateHz = this.statedIntervalS ? 1 / this.statedIntervalS : 0;
    }
    if (!(this.provisionalRateHz > 0 && Number.isFinite(this.provisionalRateHz))) this.provisionalRateHz = 0;
    this.stream(
      times,
      memory.channels.map((c) => c.values()),
      rows,
      0,
    );
  }

  private stream(timesS: Float64Array | null, values: Float64Array[], count: number, firstRow: number): void {
    if (timesS && this.hasTime) {
      if (firstRow === 0 && count > 0) this.firstTimeS = timesS[0]!;
      for (let r = 0; r < count; r++) this.fit.add(firstRow + r, timesS[r]!);
      const intervalS = 1 / this.provisionalRateHz;
      let previous = this.previousTimeS;
      for (let r = 0; r < count; r++) {
        const t = timesS[r]!;
        if (r + firstRow > 0) {
          if (t < previous && !this.monotonicError) {
            const row = firstRow + r;
            const line = this.collector().lineOfRow(row);
            this.monotonicError = { row, error: backwardsTimeError(line, this.timeColumn, t, previous) };
          }
          // Provisional: against the look-ahead's interval; re-checked exactly in pass 2.
          if (!this.stepError && Math.abs(t - previous - intervalS) > 0.5 * intervalS) this.stepError = { row: firstRow + r, stepS: t - previous };
        }
        previous = t;
      }
      this.previousTimeS = previous;
    }
    for (let c = 0; c < this.channelCount; c++) this.scans[c]!.add(values[c]!, count);
    let offset = 0;
    while (offset < count) {
      const take = Math.min(count - offset, 2 * this.segmentSamples - this.segmentFill);
      for (let e = 0; e < this.estimation.length; e++) {
        this.segmentBuffers[e]!.set(values[this.estimation[e]!]!.subarray(offset, offset + take), this.segmentFill);
      }
      this.segmentFill += take;
      offset += take;
      // A full look-ahead means its first segment is not the last one (the last takes the remainder).
      if (this.segmentFill === 2 * this.segmentSamples) {
        this.estimate(this.segmentSamples);
        for (const buffer of this.segmentBuffers) buffer.copyWithin(0, this.segmentSamples, this.segmentFill);
        this.segmentFill -= this.segmentSamples;
      }
    }
  }

  private estimate(length: number): void {
    const started = performance.now();
    for (let e = 0; e < this.estimation.length; e++) {
      const list = this.ratios[e]!;
      if (list.some((r) => r instanceof AnalysisInputError)) continue;
      // No usable rate yet (no interval stated, or a broken time axis): the error is reported after pass 1.
      if (!(this.provisionalRateHz > 0)) {
        list.push(Number.NaN);
        continue;
      }
      try {
        const segment = this.segmentBuffers[e]!.subarray(0, length);
        const ratio = estimateFundamental(segment, this.provisionalRateHz) / this.provisionalRateHz;
        list.push(ratio);
        this.trackers[e]!.feed(segment, length, ratio);
      } catch (error) {
        if (!(error instanceof AnalysisInputError)) throw error;
        list.push(error);
      }
    }
    this.fundamentalMs += performance.now() - started;
  }

  /** The last segment: whatever the look-ahead holds at the end (one to two segments). */
  end(): void {
    if (this.streaming && this.segmentFill > 0) this.estimate(this.segmentFill);
  }
}

/** Pass 2 sink: exact time-axis checks, clipping runs, the waveform excerpt, and windows from a ring buffer. */
class SecondPass implements RowSink, WindowSource {
  filled = 0;
  windowsMs = 0;
  residualError: AnalysisInputError | null = null;
  private readonly rings: Float64Array[];
  private readonly mask: number;
  private previousTimeS = Number.NaN;
  /** The next window to analyse. */
  private window = 0;

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
  ) {
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
    while (this.window + 1 < windowBounds.length) {
      const start = windowBounds[this.window]!;
      if (Math.min(Math.floor(start) - this.padding + this.span, this.recordSamples) > available) break;
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

/** Internal knobs, for tests: the frequency segment (default 2^18 samples) sets the look-ahead (two segments). */
export interface StreamTuning {
  segmentSamples?: number;
}

/**
 * Analyses a CSV file on disk with memory independent of the record's length.
 *
 * Records up to two frequency segments (2 × 2^18 rows ≈ 20 s at 25.6 kS/s) are read once into
 * memory and analysed exactly as {@link analyzeImported} does. Longer records take two streaming
 * passes: pass 1 parses every row (every parse error with its line), fits the time axis
 * incrementally, checks monotonicity, accumulates each channel's extremes and r.m.s., and
 * measures the fundamental per segment and tracks its phase (so each window spans whole cycles
 * of its own fundamental); pass 2 parses again, checks steps/residuals against the
 * whole-record fit and clipping runs against the extremes, and analyses each 10/12-cycle window
 * from a ring buffer as soon as its samples are in. Only per-window numbers are kept.
 *
 * Complexity O(file size) twice + O(samples·taps); memory ≈ 16 B × (channels + 1) × 2^19 for the
 * look-ahead, a 128 k-sample ring per channel, plus ≈ 52 numbers per channel per window.
 *
 * @param timings filled with milliseconds per stage (importMs = pass 1, rereadMs = pass 2 parsing).
 * @throws AnalysisInputError for every input problem, with `line`/`column` where it applies.
 * @example
 * const result = await streamCsvAnalysis("capture.csv", { keepWaveformCycles: 3 });
 */
export async function streamCsvAnalysis(
  path: string,
  options: AnalysisOptions = {},
  timings?: StreamTimings,
  tuning: StreamTuning = {},
): Promise<AnalysisResult> {
  const started = performance.now();
  const importOptions: ImportOptions = {
    ...(options.sampleIntervalS !== undefined ? { sampleIntervalS: options.sampleIntervalS } : {}),
    ...(options.channels ? { channels: options.channels } : {}),
  };
  checkOverrides(importOptions);
  const { head, layout } = await readCsvHead(path);
  const columns = planColumns(layout, options.channels);
  const channelColumns = columns.filter((c) => c.role === "channel");
  const timeColumn = columns.find((c) => c.role === "time");
  const segmentSamples = tuning.segmentSamples ?? options.frequencySegmentSamples ?? FREQUENCY_SEGMENT_SAMPLES;
  const firstVoltage = channelColumns.findIndex((c) => c.quantity === "voltage");
  const estimation = firstVoltage >= 0 ? [firstVoltage] : channelColumns.map((_, i) => i);
  const stated = options.sampleIntervalS ?? intervalFromPreamble(layout.preamble, layout.decimalComma)?.sampleIntervalS ?? null;
  let collector1: RowCollector | undefined;
  const first = new FirstPass(
    () => collector1!,
    channelColumns.length,
    Boolean(timeColumn),
    estimation,
    segmentSamples,
    stated,
    (timeColumn?.index ?? 0) + 1,
  );
  collector1 = new RowCollector(layout, columns, first);
  await readCsvRows(path, head, collector1);

  if (!first.streaming) {
    // Short record: the look-ahead holds all of it; the in-memory path gives the reference result.
    const capture = finishImport(collector1, first.memory!, importOptions);
    if (timings) timings.importMs = performance.now() - started;
    const result = analyzeImported(capture, { ...options, frequencySegmentSamples: segmentSamples }, timings);
    if (options.keepWaveformCycles) {
      const waveform = new WaveformCollector(options.keepWaveformCycles, result.fundamentalHz, capture.sampleIntervalS, capture.rowCount, capture.channels);
      waveform.add(
        capture.channels.map((c) => c.samples),
        capture.rowCount,
        0,
      );
      result.waveform = waveform.result();
    }
    return result;
  }

  first.end();
  const warnings = collector1.end();
  const n = collector1.rows;
  // The sample interval: the same decision as the in-memory import's (chooseSampleInterval).
  let timeCheck: ConstructorParameters<typeof SecondPass>[7] = null;
  // A given interval replaces the time column's spacing, but a column running backwards is still an error.
  if (options.sampleIntervalS !== undefined && first.monotonicError) throw first.monotonicError.error;
  const { sampleIntervalS, sampleIntervalSource } = chooseSampleInterval(
    options.sampleIntervalS,
    timeColumn
      ? () => {
          if (first.monotonicError) throw first.monotonicError.error;
          const column = timeColumn.index + 1;
          const intervalS = first.fit.slope();
          if (!(intervalS > 0)) {
            throw new AnalysisInputError(
              "irregular-time",
              `time axis does not advance: every time stamp from line ${collector1.lineOfRow(0)} on is ${first.firstTimeS} s`,
              { line: collector1.lineOfRow(0), column },
            );
          }
          const toleranceS = 0.5 * intervalS + collector1.timeResolutionS();
          const step = first.stepError;
          if (step && Math.abs(step.stepS - intervalS) > toleranceS) {
            const line = collector1.lineOfRow(step.row);
            throw new AnalysisInputError(
              "irregular-time",
              `irregular time axis at line ${line}: step of ${step.stepS.toPrecision(4)} s where the interval is ${intervalS.toPrecision(4)} s ${STEP_MESSAGE}`,
              { line, column },
            );
          }
          timeCheck = { intervalS, startS: first.fit.intercept(), toleranceS, column };
          return intervalS;
        }
      : null,
    stated,
  );
  if (timings) timings.importMs = performance.now() - started;

  // The checks analyzeSamples makes, in its order.
  let clock = performance.now();
  const { sampleIntervalS: _given, ...analysisOptions } = options;
  void _given;
  checkOptions(analysisOptions);
  const sampleRateHz = 1 / sampleIntervalS;
  const durationS = n * sampleIntervalS;
  if (sampleRateHz < 500) {
    throw new AnalysisInputError(
      "sample-rate-too-low",
      `sampling rate of ${sampleRateHz.toPrecision(4)} Hz is too low: at least 500 Hz is needed to measure a 50/60 Hz fundamental`,
    );
  }
  const unitOf = (plan: ColumnPlan): string => (plan.quantity === "current" ? "A" : "V");
  channelColumns.forEach((plan, c) => first.scans[c]!.checkNotConstant(plan.header, 1, unitOf(plan)));
  const clipWarningsAt = warnings.length;
  const rmsOf = first.scans.map((scan) => scan.rms(1));
  let reference = firstVoltage;
  if (reference < 0) reference = rmsOf.indexOf(Math.max(...rmsOf));
  if (timings) timings.checksMs = performance.now() - clock;
  clock = performance.now();
  const ratios = first.ratios[estimation.indexOf(reference)]!;
  const segmentHz = ratios.map((r) => {
    if (r instanceof AnalysisInputError) throw r;
    return r * sampleRateHz;
  });
  const bounds = segmentBounds(n, segmentSamples);
  if (bounds.length - 1 !== segmentHz.length) throw new Error(`segment count mismatch: ${bounds.length - 1} bounds, ${segmentHz.length} estimates`);
  const plan = planWindows(segmentHz, bounds, sampleRateHz, analysisOptions, warnings, first.trackers[estimation.indexOf(reference)]!.finish());
  if (timings) timings.fundamentalMs = first.fundamentalMs + performance.now() - clock;

  // Pass 2.
  const secondStarted = performance.now();
  const analyzer = new WindowAnalyzer(
    channelColumns.map((c) => ({ name: c.header, quantity: c.quantity!, phase: c.phase, scale: 1 })),
    reference,
    plan.shape,
    n,
    plan.windowBounds.length - 1,
  );
  const waveform = options.keepWaveformCycles
    ? new WaveformCollector(
        options.keepWaveformCycles,
        plan.fundamentalHz,
        sampleIntervalS,
        n,
        channelColumns.map((c) => ({ name: c.header, unit: unitOf(c) })),
      )
    : null;
  let collector2: RowCollector | undefined;
  const second = new SecondPass(() => collector2!, first.scans, analyzer, plan.windowBounds, n, plan.shape.padding, plan.shape.span, timeCheck, waveform);
  collector2 = new RowCollector(layout, columns, second);
  await readCsvRows(path, head, collector2);
  if (collector2.rows !== n) {
    throw new AnalysisInputError("unreadable-file", `cannot read file ${path}: it changed while being read (${n} rows, then ${collector2.rows})`);
  }
  second.drain();
  if (second.residualError) throw second.residualError;
  const clipWarnings = channelColumns.map((c, i) => first.scans[i]!.clipWarning(c.header, 1, unitOf(c))).filter((w): w is string => w !== null);
  warnings.splice(clipWarningsAt, 0, ...clipWarnings);
  if (timings) {
    timings.windowsMs = second.windowsMs;
    timings.rereadMs = performance.now() - secondStarted - second.windowsMs;
  }

  clock = performance.now();
  const aggregate = analyzer.finish(analysisOptions, warnings);
  aggregate.channels.forEach((channel, c) => (channel.scale = channelColumns[c]!.scale));
  const result = assembleAnalysisResult({ plan, aggregate, windowCount: analyzer.count, sampleIntervalS, durationS, warnings, sampleIntervalSource });
  if (waveform) result.waveform = waveform.result();
  if (timings) timings.aggregateMs = performance.now() - clock;
  return result;
}
