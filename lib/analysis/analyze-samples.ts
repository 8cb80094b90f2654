// The analysis pipeline on samples already in memory: fundamental → windows → resample → FFT →
// per-order values, groups, indices, power, sequence components, aggregation.
import { arrayWindowSource } from "./array-window-source";
import { assembleAnalysisResult } from "./assemble-analysis-result";
import { ChannelScan } from "./channel-scan";
import { checkOptions } from "./check-options";
import { AnalysisInputError } from "./errors";
import { estimateFundamental } from "./estimate-fundamental";
import { findOverride } from "./plan-columns";
import { planWindows } from "./plan-windows";
import { PhaseTracker } from "./phase-tracker";
import { FREQUENCY_SEGMENT_SAMPLES, segmentBounds } from "./segment-bounds";
import type { AnalysisOptions, AnalysisResult, PhaseLabel, Quantity } from "./types";
import { WindowAnalyzer } from "./window-analyzer";

/** One channel handed to {@link analyzeSamples}; values in A or V before any `scale` override. */
export interface SampleChannel {
  /** Header text; options.channels keys match it case-insensitively. */
  name: string;
  quantity?: Quantity | null;
  phase?: PhaseLabel | null;
  samples: ArrayLike<number>;
}

export interface SampleCapture {
  sampleIntervalS: number;
  channels: SampleChannel[];
  /** Warnings from the import, passed through to the result. */
  warnings?: string[];
  sampleIntervalSource?: AnalysisResult["sampleIntervalSource"];
}

/** Milliseconds spent per stage, for the benchmark. */
export interface StageTimings {
  importMs?: number;
  checksMs?: number;
  fundamentalMs?: number;
  windowsMs?: number;
  aggregateMs?: number;
}


/** A view of samples a..b (a copy for plain arrays). */
function sliceSamples(samples: ArrayLike<number>, a: number, b: number): ArrayLike<number> {
  if (a === 0 && b === samples.length) return samples;
  if (samples instanceof Float64Array || samples instanceof Float32Array) return samples.subarray(a, b);
  return Array.prototype.slice.call(samples, a, b) as number[];
}

/**
 * Analyses sampled channels of one capture and returns the result in the design's JSON shape.
 *
 * Steps: measure the fundamental on the reference channel (the first voltage, else the largest
 * current) and track its phase; choose 50/60 Hz; cut consecutive windows of 10 (50 Hz) or 12
 * (60 Hz) cycles, each of its own measured fundamental (IEC 61000-4-7:2002+A1:2008 §4.4 / §5,
 * from memory); resample each to 2^k points
 * with a band-limited kernel so harmonic h falls on bin 10·h or 12·h; FFT (fft.js); per order:
 * r.m.s. (√2·|X|/N), phase, IEC 61000-4-7 groups/subgroups; aggregate windows as r.m.s. mean,
 * maximum and 95th percentile. Phases use the cosine reference and are relative to the reference
 * channel's fundamental: φ_h − h·φ_ref,1, in degrees.
 *
 * Orders above 80 % of Nyquist (where the interpolator is no longer flat) are not evaluated and
 * reported as null, never 0. A record that holds exactly one window is analysed.
 *
 * Complexity O(n·taps) for resampling plus O(W·N log N) for the transforms (W windows of N points).
 *
 * @param timings when given, filled with milliseconds per stage.
 * @throws AnalysisInputError for unusable input (constant channel, too short, rate too low, bad options).
 * @example
 * const result = analyzeSamples({ sampleIntervalS: 1 / 6400, channels: [{ name: "Ia", quantity: "current", samples }] });
 * result.channels[0].thdPercent
 */
export function analyzeSamples(capture: SampleCapture, options: AnalysisOptions = {}, timings?: StageTimings): AnalysisResult {
  let clock = performance.now();
  const lap = (stage: Exclude<keyof StageTimings, "importMs">): void => {
    const now = performance.now();
    if (timings) timings[stage] = now - clock;
    clock = now;
  };
  checkOptions(options);
  const warnings = [...(capture.warnings ?? [])];
  const intervalS = options.sampleIntervalS ?? capture.sampleIntervalS;
  if (!(intervalS > 0 && Number.isFinite(intervalS))) {
    throw new AnalysisInputError("invalid-option", `sample interval must be a positive number of seconds, got ${intervalS}`);
  }
  const sampleRateHz = 1 / intervalS;

  const resolved = capture.channels.filter((c) => !findOverride(options.channels, c.name, c.name)?.ignore).map((c) => {
    const override = findOverride(options.channels, c.name, c.name);
    const quantity = override?.quantity ?? c.quantity ?? null;
    const phase = override && "phase" in override ? override.phase ?? null : c.phase ?? null;
    return { ...c, quantity, phase, scale: override?.scale ?? 1 };
  });
  const usable = resolved.filter((c) => c.quantity !== null);
  for (const c of resolved) if (c.quantity === null) warnings.push(`channel ${c.name} skipped: quantity unknown (map it as current or voltage)`);
  if (usable.length === 0) {
    throw new AnalysisInputError("no-channels", "no current or voltage channel to analyse");
  }
  const n = Math.min(...usable.map((c) => c.samples.length));
  const durationS = n * intervalS;
  if (sampleRateHz < 500) {
    throw new AnalysisInputError(
      "sample-rate-too-low",
      `sampling rate of ${sampleRateHz.toPrecision(4)} Hz is too low: at least 500 Hz is needed to measure a 50/60 Hz fundamental`,
    );
  }
  if (durationS < 0.17) {
    throw new AnalysisInputError(
      "too-short",
      `record is shorter than one analysis window: ${durationS.toPrecision(3)} s of data, a window is 10 cycles at 50 Hz or 12 at 60 Hz (0.2 s)`,
    );
  }
  const scans = usable.map((c) => {
    const scan = new ChannelScan();
    scan.add(c.samples, n);
    scan.checkNotConstant(c.name, c.scale, c.quantity === "current" ? "A" : "V");
    scan.countClipped(c.samples, n);
    const warning = scan.clipWarning(c.name, c.scale, c.quantity === "current" ? "A" : "V");
    if (warning) warnings.push(warning);
    return scan;
  });
  const rmsOf = usable.map((c, i) => scans[i]!.rms(c.scale));

  // Frequency reference: voltage is usually the cleanest; else the strongest current.
  lap("checksMs");
  let reference = usable.findIndex((c) => c.quantity === "voltage");
  if (reference < 0) reference = rmsOf.indexOf(Math.max(...rmsOf));
  // The fundamental is estimated per segment (≈ 10 s at 25.6 kS/s); its phase is then tracked
  // through each segment so every window spans whole cycles of its own fundamental.
  const bounds = segmentBounds(n, options.frequencySegmentSamples ?? FREQUENCY_SEGMENT_SAMPLES);
  const referenceSamples = usable[reference]!.samples;
  const tracker = new PhaseTracker();
  const segmentHz = bounds.slice(0, -1).map((first, k) => {
    const segment = sliceSamples(referenceSamples, first, bounds[k + 1]!);
    const hz = estimateFundamental(segment, sampleRateHz);
    tracker.feed(segment, segment.length, hz / sampleRateHz);
    return hz;
  });
  const plan = planWindows(segmentHz, bounds, sampleRateHz, options, warnings, tracker.finish());
  lap("fundamentalMs");

  const analyzer = new WindowAnalyzer(
    usable.map((c) => ({ name: c.name, quantity: c.quantity!, phase: c.phase, scale: c.scale })),
    reference,
    plan.shape,
    n,
    plan.windowBounds.length - 1,
  );
  const source = arrayWindowSource(usable, n);
  const windowBounds = plan.windowBounds;
  for (let w = 0; w + 1 < windowBounds.length; w++) analyzer.addWindow(windowBounds[w]!, windowBounds[w + 1]! - windowBounds[w]!, source);
  lap("windowsMs");
  const aggregate = analyzer.finish(options, warnings);
  const result = assembleAnalysisResult({
    plan,
    aggregate,
    windowCount: analyzer.count,
    sampleIntervalS: intervalS,
    durationS,
    warnings,
    ...(capture.sampleIntervalSource ? { sampleIntervalSource: options.sampleIntervalS !== undefined ? "option" : capture.sampleIntervalSource } : {}),
  });
  lap("aggregateMs");
  return result;
}
