// Per-window analysis and the whole-capture aggregation, fed one window at a time: the in-memory
// path hands it windows cut from arrays, the streaming path windows cut from a ring buffer.
import { aggregateWindows } from "./aggregate-windows";
import { getFft } from "./get-fft";
import { pairPhases } from "./pair-phases";
import { applyResample, planResample, type ResamplePlan } from "./resample";
import { sequenceComponents } from "./sequence";
import type { AnalyzerChannel, ChannelState, WindowAggregate, WindowShape } from "./window-types";
import type { AnalysisOptions } from "./types";

export type { AnalyzerChannel, WindowAggregate, WindowShape } from "./window-types";

/** Where a window's samples come from. */
export interface WindowSource {
  /**
   * Writes samples `first .. first + span − 1` of channel `channel` (in A or V, scale applied) into
   * `target`. Indices before the record's start or past its end are folded back by `period`
   * samples (the window spans whole cycles), the way the in-memory path always did.
   */
  copyWindow(channel: number, first: number, span: number, period: number, target: Float64Array): void;
}

function grow(values: Float64Array, length: number): Float64Array {
  if (values.length >= length) return values;
  const grown = new Float64Array(Math.max(length, 2 * values.length));
  grown.set(values);
  return grown;
}

/**
 * Analyses consecutive windows of a capture and aggregates them: resample each window to 2^k
 * points with a band-limited kernel (harmonic h on bin cycles·h), FFT, per-order r.m.s. and
 * phase, IEC 61000-4-7 groups/subgroups, power and sequence sums; then r.m.s. mean, maximum and
 * 95th percentile over windows. Keeps only per-window numbers (≈ 51 per channel per window), so
 * memory grows with the window count, not with the samples.
 *
 * Complexity per window O(points·taps + points·log points) per channel.
 *
 * @example
 * const analyzer = new WindowAnalyzer(channels, 0, shape, 300);
 * analyzer.addWindow(0, 1280, 1280 + 2 * shape.padding, source);
 * const { channels: results } = analyzer.finish(options, warnings);
 */
export class WindowAnalyzer {
  /** Windows added so far. */
  count = 0;
  private readonly channels: ChannelState[];
  private readonly stride: number;
  private readonly fft: ReturnType<typeof getFft>;
  private readonly scratch: Float64Array;
  private plan: ResamplePlan | undefined;
  private readonly pairs: ReturnType<typeof pairPhases>["pairs"];
  private readonly sets: ReturnType<typeof pairPhases>["sets"];
  private readonly pairActive: Float64Array;
  private readonly pairProduct: { re: number; im: number }[];
  private readonly sequenceSq: { pos: Float64Array; neg: Float64Array; zero: Float64Array }[];
  private readonly measurement: Float64Array;

  /**
   * @param reference index of the channel whose fundamental phase is the zero of all phases.
   * @param recordSamples samples in the record (windows' peaks stop at its end).
   * @param expectedWindows initial capacity of the per-window arrays (they grow when needed).
   */
  constructor(
    channels: AnalyzerChannel[],
    private readonly reference: number,
    private readonly shape: WindowShape,
    private readonly recordSamples: number,
    expectedWindows: number,
  ) {
    const { points, orders } = shape;
    const stride = orders + 1;
    const capacity = Math.max(1, Math.ceil(expectedWindows));
    this.stride = stride;
    this.fft = getFft(points);
    this.scratch = new Float64Array(shape.span);
    this.channels = channels.map((c) => ({
      ...c,
      points: new Float64Array(points),
      spectrum: new Float64Array(2 * points),
      orderRms: new Float64Array(capacity * stride),
      phasorSumRe: new Float64Array(stride),
      phasorSumIm: new Float64Array(stride),
      groupSq: new Float64Array(stride),
      subgroupSq: new Float64Array(stride),
      interGroupSq: new Float64Array(stride),
      interSubgroupSq: new Float64Array(stride),
      windowRms: new Float64Array(capacity),
      windowThd: new Float64Array(capacity),
      windowPeak: new Float64Array(capacity),
      windowRe: new Float64Array(stride),
      windowIm: new Float64Array(stride),
    }));
    const { pairs, sets } = pairPhases(this.channels);
    this.pairs = pairs;
    this.sets = sets;
    this.pairActive = new Float64Array(pairs.length);
    this.pairProduct = pairs.map(() => ({ re: 0, im: 0 }));
    this.sequenceSq = sets.map(() => ({ pos: new Float64Array(stride), neg: new Float64Array(stride), zero: new Float64Array(stride) }));
    this.measurement = new Float64Array(this.measurementLength);
  }

  private reserve(windows: number): void {
    for (const ch of this.channels) {
      if (ch.windowRms.length >= windows) continue;
      ch.orderRms = grow(ch.orderRms, windows * this.stride);
      ch.windowRms = grow(ch.windowRms, windows);
      ch.windowThd = grow(ch.windowThd, windows);
      ch.windowPeak = grow(ch.windowPeak, windows);
    }
  }

  /**
   * Analyses one window of `windowSamples` samples (fractional) starting at sample `start`
   * (fractional), reading its samples from `source`: {@link measureWindow} then {@link accumulateWindow}.
   *
   * Complexity O(channels · (points·taps + points·log points)).
   */
  addWindow(start: number, windowSamples: number, source: WindowSource): void {
    this.measureWindow(start, windowSamples, source, this.measurement);
    this.accumulateWindow(this.measurement);
  }

  /** Numbers {@link measureWindow} writes per window (see its layout). */
  get measurementLength(): number {
    return this.channels.length * (7 * this.stride + 3) + this.pairs.length + 1;
  }

  /**
   * Measures one window without adding it to the totals, so windows can be measured in any order
   * (or in another thread, by an analyzer built alike) and added in order by {@link accumulateWindow}.
   * Writes into `out` ({@link measurementLength} numbers), per channel: order r.m.s. (orders + 1),
   * bin re and im, group, subgroup, interharmonic group and subgroup squares (orders + 1 each),
   * then r.m.s., peak and THD; then each voltage–current pair's Σ v·i over the points; then the
   * reference channel's fundamental angle.
   */
  measureWindow(start: number, windowSamples: number, source: WindowSource, out: Float64Array): void {
    const { channels, fft, scratch, reference, pairs, stride } = this;
    const { cycles, points, resolvableOrder, thdMaxOrder, halfWidth, padding, span } = this.shape;
    const n = this.recordSamples;
    const binScale = Math.SQRT2 / points;
    const halfPoints = points / 2;
    const binSq = (spectrum: Float64Array, k: number): number =>
      k <= 0 || k >= halfPoints ? 0 : (spectrum[2 * k]! ** 2 + spectrum[2 * k + 1]! ** 2) * binScale * binScale;
    const first = Math.floor(start) - padding;
    const plan = planResample(start - first, windowSamples / points, points, this.plan, halfWidth);
    this.plan = plan;
    const period = Math.round(windowSamples);
    const windowFirst = Math.floor(start);
    const windowEnd = Math.min(n, Math.floor(start + windowSamples));
    const block = 7 * stride + 3;
    let referenceAngle = 0;
    for (let ci = 0; ci < channels.length; ci++) {
      const ch = channels[ci]!;
      const base = ci * block;
      const rms = base;
      const re = base + stride;
      const im = base + 2 * stride;
      const group = base + 3 * stride;
      const subgroup = base + 4 * stride;
      const inter = base + 5 * stride;
      const interSub = base + 6 * stride;
      out.fill(0, base, base + block);
      // The window with padding; beyond the record the source continues it periodically (it spans whole cycles).
      source.copyWindow(ci, first, span, period, scratch);
      let peak = 0;
      for (let j = windowFirst; j < windowEnd; j++) {
        const v = Math.abs(scratch[j - first]!);
        if (v > peak) peak = v;
      }
      applyResample(plan, scratch, ch.points);
      let sumSquares = 0;
      for (let m = 0; m < points; m++) sumSquares += ch.points[m]! ** 2;
      const windowRms = Math.sqrt(sumSquares / points);
      fft.realTransform(ch.spectrum, ch.points);
      const spec = ch.spectrum;
      out[rms] = spec[0]! / points;
      out[re] = spec[0]! / points;
      for (let h = 1; h <= resolvableOrder; h++) {
        const k = cycles * h;
        const binRe = spec[2 * k]! * binScale;
        const binIm = spec[2 * k + 1]! * binScale;
        out[re + h] = binRe;
        out[im + h] = binIm;
        out[rms + h] = Math.hypot(binRe, binIm);
        // IEC 61000-4-7:2002+A1:2008 clause 3.2 harmonic group (clause and formula from memory): bins k±(N/2−1) plus half of k±N/2.
        const halfCycles = cycles / 2;
        let sum = 0.5 * (binSq(spec, k - halfCycles) + binSq(spec, k + halfCycles));
        for (let i = -halfCycles + 1; i < halfCycles; i++) sum += binSq(spec, k + i);
        out[group + h] = sum;
        out[subgroup + h] = binSq(spec, k - 1) + binSq(spec, k) + binSq(spec, k + 1);
        let interSum = 0;
        let interSubSum = 0;
        for (let i = 1; i < cycles; i++) {
          const sq = binSq(spec, k + i);
          interSum += sq;
          if (i >= 2 && i <= cycles - 2) interSubSum += sq;
        }
        out[inter + h] = interSum;
        out[interSub + h] = interSubSum;
      }
      let harmonicSq = 0;
      for (let h = 2; h <= Math.min(thdMaxOrder, resolvableOrder); h++) harmonicSq += out[rms + h]! ** 2;
      const fundamental = out[rms + 1]!;
      out[base + 7 * stride] = windowRms;
      out[base + 7 * stride + 1] = peak;
      out[base + 7 * stride + 2] = fundamental > 0 ? (100 * Math.sqrt(harmonicSq)) / fundamental : 0;
      if (ci === reference) referenceAngle = Math.atan2(out[im + 1]!, out[re + 1]!);
    }
    const tail = channels.length * block;
    for (let p = 0; p < pairs.length; p++) {
      const v = channels[pairs[p]!.voltage]!;
      const i = channels[pairs[p]!.current]!;
      let sum = 0;
      for (let m = 0; m < points; m++) sum += v.points[m]! * i.points[m]!;
      out[tail + p] = sum;
    }
    out[tail + pairs.length] = referenceAngle;
  }

  /** Adds a window {@link measureWindow} measured to the totals, as the next window. */
  accumulateWindow(measurement: Float64Array): void {
    const { channels, pairs, sets, pairActive, pairProduct, sequenceSq, stride } = this;
    const { points, resolvableOrder } = this.shape;
    const w = this.count;
    this.reserve(w + 1);
    const block = 7 * stride + 3;
    for (let ci = 0; ci < channels.length; ci++) {
      const ch = channels[ci]!;
      const base = ci * block;
      const rowStart = w * stride;
      ch.orderRms[rowStart] = measurement[base]!;
      ch.windowRe[0] = measurement[base + stride]!;
      ch.windowIm[0] = 0;
      for (let h = 1; h <= resolvableOrder; h++) {
        ch.windowRe[h] = measurement[base + stride + h]!;
        ch.windowIm[h] = measurement[base + 2 * stride + h]!;
        ch.orderRms[rowStart + h] = measurement[base + h]!;
        ch.groupSq[h]! += measurement[base + 3 * stride + h]!;
        ch.subgroupSq[h]! += measurement[base + 4 * stride + h]!;
        ch.interGroupSq[h]! += measurement[base + 5 * stride + h]!;
        ch.interSubgroupSq[h]! += measurement[base + 6 * stride + h]!;
      }
      ch.windowRms[w] = measurement[base + 7 * stride]!;
      ch.windowPeak[w] = measurement[base + 7 * stride + 1]!;
      ch.windowThd[w] = measurement[base + 7 * stride + 2]!;
    }
    const tail = channels.length * block;
    const referenceAngle = measurement[tail + pairs.length]!;
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
      pairActive[p]! += measurement[tail + p]! / points;
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
    this.count = w + 1;
  }

  /**
   * Aggregates the windows added so far into channel results (r.m.s. mean, maximum, 95th
   * percentile per order; indices; per-window series), power per phase pair and sequence sets.
   * Pushes DC-offset warnings onto `warnings`.
   *
   * Complexity O(channels · orders · W log W) for the percentiles.
   */
  finish(options: AnalysisOptions, warnings: string[]): WindowAggregate {
    const { channels, stride, pairs, sets, pairActive, pairProduct, sequenceSq, shape, count } = this;
    return aggregateWindows({ channels, stride, pairs, sets, pairActive, pairProduct, sequenceSq, shape, windowCount: count }, options, warnings);
  }
}
