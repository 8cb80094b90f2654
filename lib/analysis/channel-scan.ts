// Raw-sample checks of one channel, fed in chunks: extremes and r.m.s. (first look), then runs
// stuck at the extremes (clipping) once the extremes are known. Same results fed whole or in chunks.
import { AnalysisInputError } from "./errors";

const NOTHING = new Float64Array(0);

/** Samples at an extreme in a run this long or longer count as clipped. */
export const CLIP_RUN = 4;

/**
 * Accumulates a channel's minimum, maximum and sum of squares over chunks, then (second look)
 * counts samples stuck at the extremes in runs of {@link CLIP_RUN} or more.
 *
 * Complexity O(1) per sample; memory O(1).
 *
 * @example
 * const scan = new ChannelScan(); scan.add(samples, samples.length); scan.checkNotConstant("Ia", 1, "A");
 * scan.countClipped(samples, samples.length); scan.clipWarning("Ia", 1, "A") // null or a warning
 */
export class ChannelScan {
  min = Infinity;
  max = -Infinity;
  sumSquares = 0;
  count = 0;
  /** Samples in clipping runs (after {@link countClipped} has seen every chunk). */
  clipped = 0;
  private run = 0;
  private runValue = Number.NaN;

  constructor() {
    // Each call's stores after its loop, run once on nothing: a hot loop compiled while it runs (the
    // first chunk) would otherwise meet them unseen and be thrown out at the end of every chunk
    // (with feedback collected from the first call: see scripts/analyze.mjs).
    this.add(NOTHING, 0);
    this.countClipped(NOTHING, 0);
  }

  /** First look: extremes and sum of squares of `count` samples. */
  add(samples: ArrayLike<number>, count: number): void {
    let { min, max, sumSquares } = this;
    for (let i = 0; i < count; i++) {
      const v = samples[i]!;
      if (v < min) min = v;
      if (v > max) max = v;
      sumSquares += v * v;
    }
    this.min = min;
    this.max = max;
    this.sumSquares = sumSquares;
    this.count += count;
  }

  /** R.m.s. of all samples seen, times |scale| (A or V). */
  rms(scale: number): number {
    return Math.sqrt(this.sumSquares / this.count) * Math.abs(scale);
  }

  /** @throws AnalysisInputError "constant-channel" when every sample had the same value. */
  checkNotConstant(name: string, scale: number, unit: string): void {
    const { min, max } = this;
    if (!(max > min) || max - min <= 1e-12 * Math.max(Math.abs(max), Math.abs(min))) {
      throw new AnalysisInputError(
        "constant-channel",
        `channel ${name} is constant (every sample is ${min * scale} ${unit}): silent or disconnected input`,
      );
    }
  }

  /** Second look (extremes known): counts samples stuck at the extremes, runs carried across chunks. */
  countClipped(samples: ArrayLike<number>, count: number): void {
    const { min, max } = this;
    let { run, runValue, clipped } = this;
    for (let i = 0; i < count; i++) {
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
    this.run = run;
    this.runValue = runValue;
    this.clipped = clipped;
  }

  /** The clipping warning, or null when no run was found. */
  clipWarning(name: string, scale: number, unit: string): string | null {
    if (this.clipped === 0) return null;
    return `channel ${name}: ${this.clipped} samples stuck at the extreme values (${(this.min * scale).toPrecision(4)} / ${(this.max * scale).toPrecision(4)} ${unit}) in runs of ${CLIP_RUN} or more — possible clipping`;
  }
}
