// From the measured fundamental to the windows: nominal 50/60 Hz, cycles per window, each
// window's boundaries, resampled points, resolvable orders, interpolator padding.
import { AnalysisInputError } from "./errors";
import { kernelHalfWidth, PASSBAND_FRACTION, STEP_SLACK } from "./resample";
import type { PhaseTrack } from "./phase-tracker";
import { scheduleWindows } from "./schedule-windows";
import type { AnalysisOptions } from "./types";
import type { WindowShape } from "./window-analyzer";

/** Windows are resampled to at most this many points (decimating longer ones with an anti-alias kernel). */
const MAX_POINTS = 4096;
const DEFAULT_MAX_ORDER = 50;

/** The fundamental and window plan of a capture. */
export interface WindowPlan {
  /** Mean fundamental over the windows: their cycles divided by their duration. */
  fundamentalHz: number;
  nominalHz: 50 | 60;
  shape: WindowShape;
  /** Window boundaries in samples (fractional): window w is [windowBounds[w], windowBounds[w + 1]). */
  windowBounds: Float64Array;
}

/**
 * Plans the windows of a record from its per-segment fundamentals (Hz) and the phase track of its
 * reference channel: chooses 50/60 Hz (options.frequencyHz, else from the mean fundamental), 10 or
 * 12 cycles per window (IEC 61000-4-7:2002+A1:2008 §4.4 / §5, from memory), cuts each window to
 * exactly that many cycles of its own fundamental (see scheduleWindows), 2^k points (≤ 4096), the
 * highest order the interpolator passes flat, and pushes warnings about orders that cannot be evaluated.
 *
 * Complexity O(segments + blocks + windows).
 *
 * @param bounds segment starts plus the record length (see segmentBounds).
 * @param track the reference channel's phase track (see PhaseTracker).
 * @throws AnalysisInputError "frequency-out-of-range", "too-short", "sample-rate-too-low".
 * @example
 * planWindows([49.98], [0, 64000], 6400, {}, warnings, track).shape.points // 2048
 */
export function planWindows(segmentHz: number[], bounds: number[], sampleRateHz: number, options: AnalysisOptions, warnings: string[], track: PhaseTrack): WindowPlan {
  const n = bounds[bounds.length - 1]!;
  const durationS = n / sampleRateHz;
  let segmentMeanHz = segmentHz[0]!;
  if (segmentHz.length > 1) {
    let weighted = 0;
    for (let k = 0; k < segmentHz.length; k++) weighted += segmentHz[k]! * (bounds[k + 1]! - bounds[k]!);
    segmentMeanHz = weighted / n;
  }
  if (!segmentHz.every(Number.isFinite)) {
    throw new AnalysisInputError("frequency-out-of-range", "the fundamental could not be measured (no usable sample interval while reading the record)");
  }
  const nominalHz: 50 | 60 = options.frequencyHz ?? (segmentMeanHz < 55 ? 50 : 60);
  for (const hz of segmentHz.length > 1 ? [segmentMeanHz, ...segmentHz] : [segmentMeanHz]) {
    if (Math.abs(hz - nominalHz) > 0.1 * nominalHz) {
      throw new AnalysisInputError(
        "frequency-out-of-range",
        options.frequencyHz
          ? `measured fundamental ${hz.toFixed(2)} Hz does not match the given nominal ${nominalHz} Hz`
          : `measured fundamental ${hz.toFixed(2)} Hz is not near 50 or 60 Hz`,
      );
    }
  }
  const cycles = nominalHz === 50 ? 10 : 12;
  const windowBounds = scheduleWindows(track, cycles, n);
  const windowCount = windowBounds.length - 1;
  if (windowCount < 1) {
    throw new AnalysisInputError(
      "too-short",
      `record is shorter than one analysis window: ${durationS.toPrecision(3)} s of data, a window is ${cycles} cycles = ${(cycles / segmentMeanHz).toFixed(4)} s at ${segmentMeanHz.toFixed(2)} Hz`,
    );
  }
  const windowSamples = (windowBounds[windowCount]! - windowBounds[0]!) / windowCount;
  const fundamentalHz = (cycles * sampleRateHz) / windowSamples;
  let longest = 0;
  for (let w = 0; w < windowCount; w++) longest = Math.max(longest, windowBounds[w + 1]! - windowBounds[w]!);
  let points = 1;
  while (points * (1 + STEP_SLACK) < windowSamples && points < MAX_POINTS) points *= 2;
  const maxOrder = options.maxOrder ?? DEFAULT_MAX_ORDER;
  const orders = Math.max(maxOrder, 50);
  const step = windowSamples / points;
  // One kernel for the whole capture: windows a hair either side of `points` samples keep the same passband.
  const halfWidth = kernelHalfWidth(step);
  const passband = PASSBAND_FRACTION[halfWidth]!;
  // The interpolator's cutoff is the lower of the source and output Nyquist frequencies (in orders).
  const cutoffOrder = Math.min(sampleRateHz / (2 * fundamentalHz), points / (2 * cycles));
  // 0.1 % slack so an order sitting exactly on the passband edge at nominal frequency is not lost to a few mHz.
  const resolvableOrder = Math.min(orders, Math.floor(passband * cutoffOrder * 1.001));
  if (resolvableOrder < 1) {
    throw new AnalysisInputError("sample-rate-too-low", `sampling rate of ${sampleRateHz.toPrecision(4)} Hz cannot resolve the fundamental`);
  }
  if (resolvableOrder < maxOrder) {
    warnings.push(
      `sampling rate ${sampleRateHz.toPrecision(4)} Hz resolves orders up to ${resolvableOrder} only (${100 * passband} % of Nyquist); orders ${resolvableOrder + 1}–${maxOrder} are not evaluated`,
    );
  }
  const thdMaxOrder = options.thdMaxOrder ?? 40;
  if (resolvableOrder < thdMaxOrder) warnings.push(`THD is computed up to order ${resolvableOrder} instead of ${thdMaxOrder} (sampling rate too low)`);
  // Windows differ by parts per thousand at most: pad for the longest step (+2 samples of slack).
  const padding = Math.ceil(halfWidth * Math.max(1, longest / points)) + 2;
  const span = Math.ceil(longest) + 2 * padding + 2;
  return {
    fundamentalHz,
    nominalHz,
    shape: { cycles, points, orders, maxOrder, resolvableOrder, thdMaxOrder, halfWidth, padding, span },
    windowBounds,
  };
}
