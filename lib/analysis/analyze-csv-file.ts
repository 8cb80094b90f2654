// Analyses a CSV file on disk in two streaming passes, with memory that does not grow with the
// record: pass 1 parses and checks every row and tracks the fundamental (per segment, per block); pass 2
// replays the rows pass 1 kept (when they fit KEEP_ROWS_BYTES) or parses the file again, and analyses
// each window from a ring buffer as soon as its samples are in.
import type { AnalysisHelper } from "./analysis-helper";
import { analyzeImported } from "./analyze-imported";
import type { StageTimings } from "./analyze-samples";
import { assembleAnalysisResult } from "./assemble-analysis-result";
import { checkOptions } from "./check-options";
import { chooseSampleInterval } from "./choose-sample-interval";
import { WaveformCollector } from "./collect-waveform";
import { AnalysisInputError } from "./errors";
import { irregularStepError } from "./fit-sample-interval";
import { checkOverrides, finishImport, type ImportOptions } from "./import-csv";
import { intervalFromPreamble } from "./interval-from-preamble";
import { planColumns, type ColumnPlan } from "./plan-columns";
import { planWindows } from "./plan-windows";
import { readCsvHead, readCsvRows } from "./read-csv-rows";
import { readInTwoParts } from "./read-in-two-parts";
import { RowCollector } from "./row-collector";
import { FREQUENCY_SEGMENT_SAMPLES, segmentBounds } from "./segment-bounds";
import { FirstPass } from "./stream-first-pass";
import { KeptRows } from "./kept-rows";
import { SecondPass, SecondPassChecks, type TimeCheck } from "./stream-second-pass";
import type { AnalysisOptions, AnalysisResult } from "./types";
import { WindowAnalyzer } from "./window-analyzer";
import { WindowClaims } from "./window-claims";

/** Timings of the streaming path: pass 1 is `importMs`; pass 2's parsing is `rereadMs`. */
export interface StreamTimings extends StageTimings {
  /** Pass 2 minus the time spent in windows: replaying the kept rows or re-parsing, time-axis and clipping checks. */
  rereadMs?: number;
  /** Time this thread waited for the analysis helper thread (its segment estimates, then its windows). */
  helperWaitMs?: number;
  /** Rows of pass 1 the analysis helper thread parsed (the later part of the file; 0 when it parsed none). */
  helperParsedRows?: number;
}

/**
 * Pass 1's parsed rows are kept for pass 2 when the record's numbers (8 bytes each, time column
 * included) are estimated to fit in this many bytes: 64 MiB holds a 60 s, 4-channel record at
 * 25.6 kS/s with its time column (61 MB). Longer records are read twice, so memory stays bounded.
 */
export const KEEP_ROWS_BYTES = 64 * 2 ** 20;

/**
 * Internal knobs, for tests: the frequency segment (default 2^18 samples) sets the look-ahead (two
 * segments); `keepRowsBytes` (default {@link KEEP_ROWS_BYTES}; 0 reads the file twice) the budget
 * for keeping pass 1's rows.
 */
export interface StreamTuning {
  segmentSamples?: number;
  keepRowsBytes?: number;
  /**
   * A helper thread (the command line starts one): while pass 1 keeps the rows, in shared memory,
   * it measures the frequency segments during pass 1 and the later windows during pass 2. The
   * same functions on the same numbers: the result does not change, only the time it takes.
   */
  helper?: AnalysisHelper | null;
}

/**
 * Analyses a CSV file on disk with memory independent of the record's length (the worker's and
 * the command line's engine entry; {@link analyzeCsvText} is the in-memory one).
 *
 * Records up to two frequency segments (2 × 2^18 rows ≈ 20 s at 25.6 kS/s) are read once into
 * memory and analysed exactly as {@link analyzeImported} does. Longer records take two streaming
 * passes: pass 1 parses every row (every parse error with its line), fits the time axis
 * incrementally, checks monotonicity, accumulates each channel's extremes and r.m.s., and
 * measures the fundamental per segment and tracks its phase (so each window spans whole cycles
 * of its own fundamental); pass 2 takes the same rows again — replayed from memory when pass 1
 * could keep them within {@link KEEP_ROWS_BYTES} (judged from the file's size and its head's row
 * length), else parsed from the file again — checks steps/residuals against the whole-record fit
 * and clipping runs against the extremes, and analyses each 10/12-cycle window from a ring buffer
 * as soon as its samples are in. Only per-window numbers are kept. Either way pass 2 sees the same
 * numbers in the same chunks, so the result does not depend on which.
 *
 * Complexity O(file size) once or twice + O(samples·taps); memory ≈ 16 B × (channels + 1) × 2^19
 * for the look-ahead, at most {@link KEEP_ROWS_BYTES} of kept rows, a 128 k-sample ring per
 * channel, plus ≈ 52 numbers per channel per window.
 *
 * @param timings filled with milliseconds per stage (importMs = pass 1, rereadMs = pass 2 parsing).
 * @throws AnalysisInputError for every input problem, with `line`/`column` where it applies.
 * @example
 * const result = await analyzeCsvFile("capture.csv", { frequencyHz: 50, channels: { Ia: { scale: 40 } }, keepWaveformCycles: 3 });
 */
export async function analyzeCsvFile(
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
  const csvHead = await readCsvHead(path);
  const { head, layout, estimatedRows } = csvHead;
  const columns = planColumns(layout, options.channels);
  const channelColumns = columns.filter((c) => c.role === "channel");
  const timeColumn = columns.find((c) => c.role === "time");
  const segmentSamples = tuning.segmentSamples ?? options.frequencySegmentSamples ?? FREQUENCY_SEGMENT_SAMPLES;
  const firstVoltage = channelColumns.findIndex((c) => c.quantity === "voltage");
  const estimation = firstVoltage >= 0 ? [firstVoltage] : channelColumns.map((_, i) => i);
  const stated = options.sampleIntervalS ?? intervalFromPreamble(layout.preamble, layout.decimalComma)?.sampleIntervalS ?? null;
  // Keep the rows for pass 2 when the whole record is expected to fit the budget (else read it twice).
  const keepRows = Math.floor((tuning.keepRowsBytes ?? KEEP_ROWS_BYTES) / (8 * (channelColumns.length + (timeColumn ? 1 : 0))));
  let collector1: RowCollector | undefined;
  const first = new FirstPass(
    () => collector1!,
    channelColumns.length,
    Boolean(timeColumn),
    estimation,
    segmentSamples,
    stated,
    (timeColumn?.index ?? 0) + 1,
    estimatedRows <= keepRows ? keepRows : 0,
    tuning.helper ?? null,
    estimatedRows,
  );
  collector1 = new RowCollector(layout, columns, first);
  // With the helper thread and rows kept in shared memory, it parses the later part of the file meanwhile.
  if (tuning.helper && first.kept?.shared) {
    const helperRows = await readInTwoParts(path, csvHead, collector1, first, tuning.helper, estimatedRows > 2 * segmentSamples);
    if (timings) timings.helperParsedRows = helperRows;
  } else {
    await readCsvRows(path, head, collector1);
  }

  if (!first.streaming) {
    // Short record: the look-ahead holds all of it; the in-memory path gives the reference result.
    const capture = finishImport(collector1, first.lookAhead(), importOptions);
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
  let timeCheck: TimeCheck | null = null;
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
          if (step && Math.abs(step.stepS - intervalS) > toleranceS) throw irregularStepError(collector1.lineOfRow(step.row), column, step.stepS, intervalS);
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
  // With the helper thread and the rows kept in shared memory (and no waveform excerpt asked for),
  // pass 2's row checks run now, over the kept columns, while the helper measures the last segments;
  // pass 2 is then the windows alone. An irregular step is thrown where pass 2 would throw it.
  const helper = first.kept?.shared ? (tuning.helper ?? null) : null;
  clock = performance.now();
  const checksFirst = helper && !options.keepWaveformCycles ? new SecondPassChecks(() => collector1, first.scans, timeCheck) : null;
  const stepError = checksFirst?.checkKept(first.kept!, n) ?? null;
  const checksFirstMs = performance.now() - clock;
  clock = performance.now();
  const measured = await first.segmentResults();
  const segmentsWaitMs = first.segmentsMeasuredElsewhere ? performance.now() - clock : 0;
  if (timings && first.segmentsMeasuredElsewhere) timings.helperWaitMs = segmentsWaitMs;
  const ratios = measured.ratios[estimation.indexOf(reference)]!;
  const segmentHz = ratios.map((r) => {
    if (r instanceof AnalysisInputError) throw r;
    return r * sampleRateHz;
  });
  const bounds = segmentBounds(n, segmentSamples);
  if (bounds.length - 1 !== segmentHz.length) throw new Error(`segment count mismatch: ${bounds.length - 1} bounds, ${segmentHz.length} estimates`);
  const plan = planWindows(segmentHz, bounds, sampleRateHz, analysisOptions, warnings, measured.tracks[estimation.indexOf(reference)]!);
  // With the helper, its measuring ran alongside pass 1: this thread's share is the wait and the plan.
  if (timings) timings.fundamentalMs = (first.segmentsMeasuredElsewhere ? 0 : measured.fundamentalMs) + performance.now() - clock;

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
  // With the rows kept in shared memory, the helper thread measures windows from the back while this
  // thread measures them from the front as pass 2 brings their samples in, each claiming a window
  // before measuring it (WindowClaims): the quicker takes more. They are added to the totals in window order.
  const windowCount = plan.windowBounds.length - 1;
  const claims = helper ? WindowClaims.create(windowCount) : null;
  const helped = helper
    ? (() => {
        // Room for every window (only the pages of those the helper measures are ever touched).
        const out = new Float64Array(new SharedArrayBuffer(8 * windowCount * analyzer.measurementLength));
        const done = helper.measureWindows({
          channels: first.kept!.channels.map((c) => c.data),
          analyzerChannels: channelColumns.map((c) => ({ name: c.header, quantity: c.quantity!, phase: c.phase, scale: 1 })),
          reference,
          shape: plan.shape,
          recordSamples: n,
          windowBounds: plan.windowBounds,
          claims: claims!.cell,
          out,
        });
        // Awaited below; an input error thrown before then must not leave it unhandled.
        done.catch(() => undefined);
        return { out, done };
      })()
    : null;
  /** Windows measured on this thread (0 … measuredHere − 1); the helper measured the rest. */
  let measuredHere: number;
  let windowsMs: number;
  if (checksFirst) {
    if (stepError) throw stepError;
    // The windows from the front, straight from the kept columns (as the helper reads them from the back).
    const source = KeptRows.windowSource(
      first.kept!.channels.map((c) => c.data),
      n,
    );
    const started = performance.now();
    measuredHere = 0;
    for (let w = claims!.takeFront(); w >= 0; w = claims!.takeFront()) {
      analyzer.addWindow(plan.windowBounds[w]!, plan.windowBounds[w + 1]! - plan.windowBounds[w]!, source);
      measuredHere = w + 1;
    }
    windowsMs = performance.now() - started;
    if (checksFirst.residualError) throw checksFirst.residualError;
  } else {
    let collector2: RowCollector | undefined;
    const second = new SecondPass(() => collector2!, first.scans, analyzer, plan.windowBounds, n, plan.shape.padding, plan.shape.span, timeCheck, waveform, claims);
    if (first.kept) {
      // The rows pass 1 kept, replayed: the same chunks the file would give again.
      collector2 = collector1;
      await first.kept.replay(n, second);
    } else {
      collector2 = new RowCollector(layout, columns, second);
      await readCsvRows(path, head, collector2);
      if (collector2.rows !== n) {
        throw new AnalysisInputError("unreadable-file", `cannot read file ${path}: it changed while being read (${n} rows, then ${collector2.rows})`);
      }
    }
    second.drain();
    if (second.residualError) throw second.residualError;
    measuredHere = second.window;
    windowsMs = second.windowsMs;
  }
  if (helped) {
    const waitStarted = performance.now();
    const from = await helped.done;
    if (timings) timings.helperWaitMs = (timings.helperWaitMs ?? 0) + performance.now() - waitStarted;
    if (from !== measuredHere) throw new Error(`windows shared out wrongly: this thread measured ${measuredHere}, the helper from ${from} on`);
    const started = performance.now();
    const length = analyzer.measurementLength;
    for (let w = from; w < windowCount; w++) analyzer.accumulateWindow(helped.out.subarray(w * length, (w + 1) * length));
    windowsMs += performance.now() - started;
  }
  const clipWarnings = channelColumns.map((c, i) => first.scans[i]!.clipWarning(c.header, 1, unitOf(c))).filter((w): w is string => w !== null);
  warnings.splice(clipWarningsAt, 0, ...clipWarnings);
  if (timings) {
    timings.windowsMs = windowsMs;
    timings.rereadMs = checksFirstMs + performance.now() - secondStarted - windowsMs;
  }

  clock = performance.now();
  const aggregate = analyzer.finish(analysisOptions, warnings);
  aggregate.channels.forEach((channel, c) => (channel.scale = channelColumns[c]!.scale));
  const result = assembleAnalysisResult({ plan, aggregate, windowCount: analyzer.count, sampleIntervalS, durationS, warnings, sampleIntervalSource });
  if (waveform) result.waveform = waveform.result();
  if (timings) timings.aggregateMs = performance.now() - clock;
  return result;
}
