// The analysis pipeline on samples already in memory: fundamental → windows → resample → FFT →
// per-order values, groups, indices, power, sequence components, aggregation.
import { summarizeWindows } from "./aggregate";
import { AnalysisInputError } from "./errors";
import { estimateFundamental } from "./estimate-fundamental";
import { getFft } from "./get-fft";
import { computeIndices } from "./indices";
import { pairPhases } from "./pair-phases";
import { findOverride } from "./plan-columns";
import { pairPower } from "./power";
import { applyResample, kernelHalfWidth, planResample, PASSBAND_FRACTION, type ResamplePlan } from "./resample";
import { sequenceComponents, type Phasor } from "./sequence";
import type {
  AnalysisOptions,
  AnalysisResult,
  ChannelResult,
  HarmonicGroupValue,
  HarmonicValue,
  PhaseLabel,
  PowerPhase,
  Quantity,
  SequenceSet,
} from "./types";

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

/** Longest window allowed to extend past the record, as a fraction of a window (IEC 61000-4-7 sync tolerance is ±0.03 %). */
const WINDOW_FIT_TOLERANCE = 1e-3;
/** Windows are resampled to at most this many points (decimating longer ones with an anti-alias kernel). */
const MAX_POINTS = 4096;
const DEFAULT_MAX_ORDER = 50;
const CLIP_RUN = 4;
const DC_WARNING_FRACTION = 0.02;

interface ChannelState {
  name: string;
  quantity: Quantity;
  phase: PhaseLabel | null;
  samples: ArrayLike<number>;
  scale: number;
  points: Float64Array;
  spectrum: Float64Array;
  /** Per window × order (0..orders) r.m.s.; order 0 holds the signed DC. */
  orderRms: Float64Array;
  phasorSumRe: Float64Array;
  phasorSumIm: Float64Array;
  /** Sums of squares over windows of group, subgroup, interharmonic group and subgroup per order. */
  groupSq: Float64Array;
  subgroupSq: Float64Array;
  interGroupSq: Float64Array;
  interSubgroupSq: Float64Array;
  windowRms: Float64Array;
  windowThd: Float64Array;
  windowPeak: Float64Array;
  windowRe: Float64Array;
  windowIm: Float64Array;
}

function fail(code: "invalid-option", message: string): never {
  throw new AnalysisInputError(code, message);
}

function checkOptions(options: AnalysisOptions): void {
  const { frequencyHz, maxOrder, thdMaxOrder, ilA, irefA } = options;
  if (frequencyHz !== undefined && frequencyHz !== 50 && frequencyHz !== 60) fail("invalid-option", `frequency must be 50 or 60 Hz, got ${frequencyHz}`);
  if (maxOrder !== undefined && !(Number.isInteger(maxOrder) && maxOrder >= 1 && maxOrder <= 100)) {
    fail("invalid-option", `max order must be an integer from 1 to 100, got ${maxOrder}`);
  }
  if (thdMaxOrder !== undefined && thdMaxOrder !== 40 && thdMaxOrder !== 50) fail("invalid-option", `THD max order must be 40 or 50, got ${thdMaxOrder}`);
  if (ilA !== undefined && !(ilA > 0 && Number.isFinite(ilA))) fail("invalid-option", `IL must be a positive current in A, got ${ilA}`);
  if (irefA !== undefined && !(irefA > 0 && Number.isFinite(irefA))) fail("invalid-option", `Iref must be a positive current in A, got ${irefA}`);
  if (options.sampleIntervalS !== undefined && !(options.sampleIntervalS > 0 && Number.isFinite(options.sampleIntervalS))) {
    fail("invalid-option", `sample interval must be a positive number of seconds, got ${options.sampleIntervalS}`);
  }
}

/** Raw-sample checks: constant channel (error), clipping and the channel's extremes. */
function scanChannel(name: string, samples: ArrayLike<number>, scale: number, unit: string, warnings: string[]): number {
  const n = samples.length;
  let min = Infinity;
  let max = -Infinity;
  let sumSquares = 0;
  for (let i = 0; i < n; i++) {
    const v = samples[i]!;
    if (v < min) min = v;
    if (v > max) max = v;
    sumSquares += v * v;
  }
  if (!(max > min) || max - min <= 1e-12 * Math.max(Math.abs(max), Math.abs(min))) {
    throw new AnalysisInputError(
      "constant-channel",
      `channel ${name} is constant (every sample is ${min * scale} ${unit}): silent or disconnected input`,
    );
  }
  let clipped = 0;
  let run = 0;
  let runValue = Number.NaN;
  for (let i = 0; i < n; i++) {
    const v = samples[i]!;
    if ((v === max || v === min) && v === runValue) {
      run++;
      if (run === CLIP_RUN) clipped += CLIP_RUN;
      else if (run > CLIP_RUN) clipped++;
    } else {
      run = v === max || v === min ? 1 : 0;
      runValue = v;
    }
  }
  if (clipped > 0) {
    warnings.push(
      `channel ${name}: ${clipped} samples stuck at the extreme values (${(min * scale).toPrecision(4)} / ${(max * scale).toPrecision(4)} ${unit}) in runs of ${CLIP_RUN} or more — possible clipping`,
    );
  }
  return Math.sqrt(sumSquares / n) * Math.abs(scale);
}

/**
 * Analyses sampled channels of one capture and returns the result in the design's JSON shape.
 *
 * Steps: measure the fundamental on the reference channel (the first voltage, else the largest
 * current); choose 50/60 Hz; cut consecutive windows of 10 (50 Hz) or 12 (60 Hz) cycles of the
 * measured fundamental (IEC 61000-4-7 §4.4 / §5.5.1, from memory); resample each to 2^k points
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
  if (!(intervalS > 0 && Number.isFinite(intervalS))) fail("invalid-option", `sample interval must be a positive number of seconds, got ${intervalS}`);
  const sampleRateHz = 1 / intervalS;

  const resolved = capture.channels.map((c) => {
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
  const rmsOf = usable.map((c) => scanChannel(c.name, c.samples, c.scale, c.quantity === "current" ? "A" : "V", warnings));

  // Frequency reference: voltage is usually the cleanest; else the strongest current.
  lap("checksMs");
  let reference = usable.findIndex((c) => c.quantity === "voltage");
  if (reference < 0) reference = rmsOf.indexOf(Math.max(...rmsOf));
  const fundamentalHz = estimateFundamental(usable[reference]!.samples, sampleRateHz);
  const nominalHz: 50 | 60 = options.frequencyHz ?? (fundamentalHz < 55 ? 50 : 60);
  if (Math.abs(fundamentalHz - nominalHz) > 0.1 * nominalHz) {
    throw new AnalysisInputError(
      "frequency-out-of-range",
      options.frequencyHz
        ? `measured fundamental ${fundamentalHz.toFixed(2)} Hz does not match the given nominal ${nominalHz} Hz`
        : `measured fundamental ${fundamentalHz.toFixed(2)} Hz is not near 50 or 60 Hz`,
    );
  }
  lap("fundamentalMs");
  const cycles = nominalHz === 50 ? 10 : 12;
  const windowSamples = (cycles * sampleRateHz) / fundamentalHz;
  const windowCount = Math.floor(n / windowSamples + WINDOW_FIT_TOLERANCE);
  if (windowCount < 1) {
    throw new AnalysisInputError(
      "too-short",
      `record is shorter than one analysis window: ${durationS.toPrecision(3)} s of data, a window is ${cycles} cycles = ${(cycles / fundamentalHz).toFixed(4)} s at ${fundamentalHz.toFixed(2)} Hz`,
    );
  }
  let points = 1;
  while (points < windowSamples && points < MAX_POINTS) points *= 2;
  const maxOrder = options.maxOrder ?? DEFAULT_MAX_ORDER;
  const orders = Math.max(maxOrder, 50);
  const step = windowSamples / points;
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

  // Per-window processing buffers.
  const fft = getFft(points);
  const stride = orders + 1;
  const channels: ChannelState[] = usable.map((c) => ({
    name: c.name,
    quantity: c.quantity!,
    phase: c.phase,
    samples: c.samples,
    scale: c.scale,
    points: new Float64Array(points),
    spectrum: new Float64Array(2 * points),
    orderRms: new Float64Array(windowCount * stride),
    phasorSumRe: new Float64Array(stride),
    phasorSumIm: new Float64Array(stride),
    groupSq: new Float64Array(stride),
    subgroupSq: new Float64Array(stride),
    interGroupSq: new Float64Array(stride),
    interSubgroupSq: new Float64Array(stride),
    windowRms: new Float64Array(windowCount),
    windowThd: new Float64Array(windowCount),
    windowPeak: new Float64Array(windowCount),
    windowRe: new Float64Array(stride),
    windowIm: new Float64Array(stride),
  }));
  const { pairs, sets } = pairPhases(channels);
  const pairActive = new Float64Array(pairs.length);
  const pairProduct = pairs.map(() => ({ re: 0, im: 0 }));
  const sequenceSq = sets.map(() => ({ pos: new Float64Array(stride), neg: new Float64Array(stride), zero: new Float64Array(stride) }));

  const padding = Math.ceil(halfWidth * Math.max(1, step)) + 2;
  const span = Math.ceil(windowSamples) + 2 * padding + 2;
  const scratch = new Float64Array(span);
  const period = Math.round(windowSamples);
  const binScale = Math.SQRT2 / points;
  const halfPoints = points / 2;
  const binSq = (spectrum: Float64Array, k: number): number =>
    k <= 0 || k >= halfPoints ? 0 : (spectrum[2 * k]! ** 2 + spectrum[2 * k + 1]! ** 2) * binScale * binScale;
  let plan: ResamplePlan | undefined;

  for (let w = 0; w < windowCount; w++) {
    const start = w * windowSamples;
    const first = Math.floor(start) - padding;
    plan = planResample(start - first, step, points, plan);
    const windowFirst = Math.floor(start);
    const windowEnd = Math.min(n, Math.floor(start + windowSamples));
    let referenceAngle = 0;
    for (let ci = 0; ci < channels.length; ci++) {
      const ch = channels[ci]!;
      const { samples, scale } = ch;
      // Copy the window with padding; beyond the record, continue the window periodically (it spans whole cycles).
      for (let k = 0; k < span; k++) {
        let j = first + k;
        while (j < 0) j += period;
        while (j >= n) j -= period;
        if (j < 0) j = 0;
        scratch[k] = samples[j]! * scale;
      }
      let peak = 0;
      for (let j = windowFirst; j < windowEnd; j++) {
        const v = Math.abs(samples[j]! * scale);
        if (v > peak) peak = v;
      }
      applyResample(plan, scratch, ch.points);
      let sumSquares = 0;
      for (let m = 0; m < points; m++) sumSquares += ch.points[m]! ** 2;
      const windowRms = Math.sqrt(sumSquares / points);
      fft.realTransform(ch.spectrum, ch.points);
      const spec = ch.spectrum;
      const base = w * stride;
      ch.orderRms[base] = spec[0]! / points;
      ch.windowRe[0] = spec[0]! / points;
      ch.windowIm[0] = 0;
      for (let h = 1; h <= resolvableOrder; h++) {
        const k = cycles * h;
        const re = spec[2 * k]! * binScale;
        const im = spec[2 * k + 1]! * binScale;
        ch.windowRe[h] = re;
        ch.windowIm[h] = im;
        ch.orderRms[base + h] = Math.hypot(re, im);
        // IEC 61000-4-7 §4.2 (reference sheet, from memory): group = bins k±(N/2−1) plus half of k±N/2.
        const halfCycles = cycles / 2;
        let group = 0.5 * (binSq(spec, k - halfCycles) + binSq(spec, k + halfCycles));
        for (let i = -halfCycles + 1; i < halfCycles; i++) group += binSq(spec, k + i);
        ch.groupSq[h]! += group;
        ch.subgroupSq[h]! += binSq(spec, k - 1) + binSq(spec, k) + binSq(spec, k + 1);
        let inter = 0;
        let interSub = 0;
        for (let i = 1; i < cycles; i++) {
          const sq = binSq(spec, k + i);
          inter += sq;
          if (i >= 2 && i <= cycles - 2) interSub += sq;
        }
        ch.interGroupSq[h]! += inter;
        ch.interSubgroupSq[h]! += interSub;
      }
      ch.windowRms[w] = windowRms;
      ch.windowPeak[w] = peak;
      let harmonicSq = 0;
      for (let h = 2; h <= Math.min(thdMaxOrder, resolvableOrder); h++) harmonicSq += ch.orderRms[base + h]! ** 2;
      const fundamental = ch.orderRms[base + 1]!;
      ch.windowThd[w] = fundamental > 0 ? (100 * Math.sqrt(harmonicSq)) / fundamental : 0;
      if (ci === reference) referenceAngle = Math.atan2(ch.windowIm[1]!, ch.windowRe[1]!);
    }
    // Phases relative to the reference fundamental: rotate order h by −h·φ_ref.
    for (const ch of channels) {
      for (let h = 1; h <= resolvableOrder; h++) {
        const c = Math.cos(-h * referenceAngle);
        const s = Math.sin(-h * referenceAngle);
        ch.phasorSumRe[h]! += ch.windowRe[h]! * c - ch.windowIm[h]! * s;
        ch.phasorSumIm[h]! += ch.windowRe[h]! * s + ch.windowIm[h]! * c;
      }
    }
    for (let p = 0; p < pairs.length; p++) {
      const v = channels[pairs[p]!.voltage]!;
      const i = channels[pairs[p]!.current]!;
      let sum = 0;
      for (let m = 0; m < points; m++) sum += v.points[m]! * i.points[m]!;
      pairActive[p]! += sum / points;
      // V1·conj(I1)
      pairProduct[p]!.re += v.windowRe[1]! * i.windowRe[1]! + v.windowIm[1]! * i.windowIm[1]!;
      pairProduct[p]!.im += v.windowIm[1]! * i.windowRe[1]! - v.windowRe[1]! * i.windowIm[1]!;
    }
    for (let s = 0; s < sets.length; s++) {
      const [a, b, c] = [channels[sets[s]!.a]!, channels[sets[s]!.b]!, channels[sets[s]!.c]!];
      const acc = sequenceSq[s]!;
      for (let h = 1; h <= resolvableOrder; h++) {
        const seq = sequenceComponents(
          { re: a.windowRe[h]!, im: a.windowIm[h]! },
          { re: b.windowRe[h]!, im: b.windowIm[h]! },
          { re: c.windowRe[h]!, im: c.windowIm[h]! },
        );
        acc.pos[h]! += seq.positive.re ** 2 + seq.positive.im ** 2;
        acc.neg[h]! += seq.negative.re ** 2 + seq.negative.im ** 2;
        acc.zero[h]! += seq.zero.re ** 2 + seq.zero.im ** 2;
      }
    }
  }

  lap("windowsMs");
  // Aggregation.
  const eddyLossRatio = options.factorKEddyLossRatio ?? 0.1;
  const exponent = options.factorKExponent ?? 1.7;
  const meanRoot = (sumSq: number): number => Math.sqrt(sumSq / windowCount);
  const results: ChannelResult[] = channels.map((ch) => {
    const unit = ch.quantity === "current" ? "A" : "V";
    const aggregated = new Float64Array(stride);
    const harmonics: HarmonicValue[] = [];
    for (let h = 1; h <= orders; h++) {
      if (h > resolvableOrder) {
        if (h <= maxOrder) harmonics.push({ order: h, rms: null, phaseDeg: null, percentOfFundamental: null, max: null, p95: null });
        continue;
      }
      const summary = summarizeWindows(ch.orderRms, h, stride, windowCount);
      aggregated[h] = summary.rmsMean;
      if (h <= maxOrder) {
        harmonics.push({
          order: h,
          rms: summary.rmsMean,
          phaseDeg: (Math.atan2(ch.phasorSumIm[h]!, ch.phasorSumRe[h]!) * 180) / Math.PI,
          percentOfFundamental: 0,
          max: summary.max,
          p95: summary.p95,
        });
      }
    }
    const fundamentalRms = aggregated[1]!;
    for (const value of harmonics) {
      if (value.rms !== null) value.percentOfFundamental = fundamentalRms > 0 ? (100 * value.rms) / fundamentalRms : 0;
    }
    const indices = computeIndices(aggregated, {
      resolvableOrder,
      thdMaxOrder,
      eddyLossRatio,
      exponent,
      ...(ch.quantity === "current" && options.ilA !== undefined ? { ilA: options.ilA } : {}),
      ...(ch.quantity === "current" && options.irefA !== undefined ? { irefA: options.irefA } : {}),
    });
    let dcSum = 0;
    let crestSum = 0;
    let sumSquares = 0;
    let peak = 0;
    for (let w = 0; w < windowCount; w++) {
      dcSum += ch.orderRms[w * stride]!;
      const rms = ch.windowRms[w]!;
      sumSquares += rms * rms;
      crestSum += rms > 0 ? ch.windowPeak[w]! / rms : 0;
      if (ch.windowPeak[w]! > peak) peak = ch.windowPeak[w]!;
    }
    const rms = meanRoot(sumSquares);
    const dc = dcSum / windowCount;
    if (Math.abs(dc) > DC_WARNING_FRACTION * fundamentalRms) {
      warnings.push(`channel ${ch.name}: DC offset of ${dc.toPrecision(3)} ${unit} (${((100 * Math.abs(dc)) / fundamentalRms).toFixed(1)} % of the fundamental)`);
    }
    const groups: HarmonicGroupValue[] = [];
    for (let h = 1; h <= maxOrder; h++) {
      const ok = h <= resolvableOrder;
      groups.push({
        order: h,
        groupRms: ok ? meanRoot(ch.groupSq[h]!) : null,
        subgroupRms: ok ? meanRoot(ch.subgroupSq[h]!) : null,
        interharmonicGroupRms: ok ? meanRoot(ch.interGroupSq[h]!) : null,
        interharmonicSubgroupRms: ok ? meanRoot(ch.interSubgroupSq[h]!) : null,
      });
    }
    const result: ChannelResult = {
      name: ch.name,
      quantity: ch.quantity,
      unit,
      phase: ch.phase,
      rms,
      dc,
      fundamentalRms,
      thdPercent: indices.thdPercent,
      thdMaxOrder: indices.thdMaxOrder,
      crestFactor: crestSum / windowCount,
      kFactor: indices.kFactor,
      harmonics,
      thd40Percent: indices.thd40Percent,
      thd50Percent: indices.thd50Percent,
      factorK: indices.factorK,
      factorKParameters: { eddyLossRatio, exponent, maxOrder: indices.kMaxOrder },
      peak,
      scale: ch.scale,
      groups,
      series: {
        rms: Array.from(ch.windowRms),
        thdPercent: Array.from(ch.windowThd),
        fundamentalRms: Array.from({ length: windowCount }, (_, w) => ch.orderRms[w * stride + 1]!),
      },
    };
    if (indices.pwhdPercent !== null) result.pwhdPercent = indices.pwhdPercent;
    if (ch.quantity === "current") {
      result.thcA = indices.thcA;
      if (indices.pwhcA !== null) result.pwhcA = indices.pwhcA;
      if (indices.tddPercent !== undefined) result.tddPercent = indices.tddPercent;
      if (indices.thcPercentOfIref !== undefined) result.thcPercentOfIref = indices.thcPercentOfIref;
      if (indices.pwhcPercentOfIref !== undefined) result.pwhcPercentOfIref = indices.pwhcPercentOfIref;
    }
    if (options.includeOrderSeries) {
      result.harmonicSeries = Array.from({ length: maxOrder }, (_, i) =>
        i + 1 > resolvableOrder ? null : Array.from({ length: windowCount }, (_, w) => ch.orderRms[w * stride + i + 1]!),
      );
    }
    return result;
  });

  const phases: PowerPhase[] = pairs.map((pair, p) => {
    const v = results[pair.voltage]!;
    const i = results[pair.current]!;
    const power = pairPower({
      activePowerW: pairActive[p]! / windowCount,
      voltageRms: v.rms,
      currentRms: i.rms,
      currentFundamentalRms: i.fundamentalRms,
      fundamentalProduct: pairProduct[p]!,
    });
    return { voltage: v.name, current: i.name, phase: pair.phase, ...power };
  });
  let total: AnalysisResult["power"]["total"] = null;
  if (phases.length >= 2) {
    const activePowerW = phases.reduce((s, p) => s + p.activePowerW, 0);
    const apparentPowerVA = phases.reduce((s, p) => s + p.apparentPowerVA, 0);
    total = { activePowerW, apparentPowerVA, truePowerFactor: apparentPowerVA > 0 ? activePowerW / apparentPowerVA : 0 };
  }

  const sequence: SequenceSet[] = sets.map((set, s) => {
    const acc = sequenceSq[s]!;
    const orderValues = [];
    for (let h = 1; h <= maxOrder; h++) {
      const ok = h <= resolvableOrder;
      orderValues.push({
        order: h,
        positiveRms: ok ? meanRoot(acc.pos[h]!) : null,
        negativeRms: ok ? meanRoot(acc.neg[h]!) : null,
        zeroRms: ok ? meanRoot(acc.zero[h]!) : null,
      });
    }
    const positive = meanRoot(acc.pos[1]!);
    return {
      quantity: set.quantity,
      unit: set.quantity === "current" ? "A" : "V",
      channels: [results[set.a]!.name, results[set.b]!.name, results[set.c]!.name],
      unbalancePercent: positive > 0 ? (100 * meanRoot(acc.neg[1]!)) / positive : 0,
      orders: orderValues,
    };
  });

  const result: AnalysisResult = {
    fundamentalHz,
    nominalHz,
    sampleIntervalS: intervalS,
    durationS,
    window: { cycles, points, count: windowCount },
    maxResolvableOrder: resolvableOrder,
    channels: results,
    power: { phases, total },
    warnings,
  };
  if (sequence.length > 0) result.sequence = sequence;
  lap("aggregateMs");
  if (capture.sampleIntervalSource) result.sampleIntervalSource = options.sampleIntervalS !== undefined ? "option" : capture.sampleIntervalSource;
  return result;
}
