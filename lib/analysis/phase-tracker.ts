// Follows the fundamental's phase through a record, block by block, so that each analysis window
// can be cut to exactly 10 or 12 cycles of its own fundamental (IEC 61000-4-7 §4.4 / §5).

/** Cycles of the fundamental per measuring block. */
const BLOCK_CYCLES = 5;
/** A block whose fundamental is below this fraction of the strongest so far has no phase worth following. */
const WEAK_FRACTION = 0.01;

/** The fundamental's unwrapped phase, in cycles, at the centre of consecutive blocks. */
export interface PhaseTrack {
  /** Samples per block; block j spans samples j·B … j·B + B − 1, its centre is j·B + (B − 1)/2. */
  blockSamples: number;
  /** Unwrapped phase in cycles at each block centre (cosine reference). */
  phasesCycles: Float64Array;
  /** Carrier of the first block, cycles per sample: the slope used when there is a single block. */
  firstCarrier: number;
}

/**
 * Measures the fundamental's phase of a record fed in order, chunk by chunk, in consecutive
 * Hann-windowed blocks of about five cycles. Each block's phasor at the carrier frequency (the
 * segment estimate given with the samples, in cycles per sample) is the phase at the block centre:
 * the Hann window is symmetric, so a frequency slightly off the carrier, or a slow ramp, shifts
 * the phase at the centre by nothing to first order. Harmonics of a block of B ≈ 5 cycles fall on
 * the Hann window's nulls (5·(h − 1) bins away), so they do not bias the phase. Consecutive phases
 * are unwrapped against the carrier's advance (valid while the frequency stays within ±10 % of it);
 * a block whose fundamental is under 1 % of the strongest so far (a current that stops) advances
 * by the carrier instead.
 *
 * The result depends only on the samples and on the carrier given with each sample, not on how
 * the record is cut into chunks: the in-memory and the streaming paths get the same track.
 *
 * Complexity O(1) per sample (one complex multiply-add), memory one number per block.
 *
 * @example
 * const tracker = new PhaseTracker(); tracker.feed(samples, samples.length, 50 / 6400); const track = tracker.finish();
 */
export class PhaseTracker {
  private blockSamples = 0;
  private fill = 0;
  /** Running sums of the block being filled: Σx·kernel (re, im) and Σx. */
  private sumRe = 0;
  private sumIm = 0;
  private sum = 0;
  /** Largest phasor magnitude so far: blocks far below it hold no fundamental to follow. */
  private strongest = 0;
  /** Carrier of the block being filled (that of its first sample). */
  private blockCarrier = 0;
  private kernelCarrier = Number.NaN;
  private kernelRe = new Float64Array(0);
  private kernelIm = new Float64Array(0);
  private kernelSumRe = 0;
  private kernelSumIm = 0;
  private phases = new Float64Array(64);
  private count = 0;
  private firstCarrier = Number.NaN;

  /**
   * Adds the next `count` samples of the reference channel.
   * @param carrier the fundamental's estimate for these samples, in cycles per sample (f / sample rate).
   */
  feed(samples: ArrayLike<number>, count: number, carrier: number): void {
    if (this.blockSamples === 0) {
      this.blockSamples = Math.max(4, Math.round(BLOCK_CYCLES / carrier));
      this.firstCarrier = carrier;
    }
    const b = this.blockSamples;
    let { fill, sumRe, sumIm, sum } = this;
    let kernelRe = this.kernelRe;
    let kernelIm = this.kernelIm;
    for (let i = 0; i < count; i++) {
      if (fill === 0) {
        this.blockCarrier = carrier;
        this.kernel(carrier);
        kernelRe = this.kernelRe;
        kernelIm = this.kernelIm;
      }
      const x = samples[i]!;
      sumRe += x * kernelRe[fill]!;
      sumIm += x * kernelIm[fill]!;
      sum += x;
      if (++fill === b) {
        this.measure(sumRe, sumIm, sum);
        fill = 0;
        sumRe = 0;
        sumIm = 0;
        sum = 0;
      }
    }
    this.fill = fill;
    this.sumRe = sumRe;
    this.sumIm = sumIm;
    this.sum = sum;
  }

  /** The phases measured so far (a partial last block is left out). */
  finish(): PhaseTrack {
    return { blockSamples: this.blockSamples, phasesCycles: this.phases.slice(0, this.count), firstCarrier: this.firstCarrier };
  }

  private kernel(carrier: number): void {
    if (carrier === this.kernelCarrier) return;
    const b = this.blockSamples;
    if (this.kernelRe.length !== b) {
      this.kernelRe = new Float64Array(b);
      this.kernelIm = new Float64Array(b);
    }
    let sumRe = 0;
    let sumIm = 0;
    for (let i = 0; i < b; i++) {
      // Hann window symmetric about (B − 1)/2.
      const w = Math.sin((Math.PI * (i + 0.5)) / b) ** 2;
      const angle = 2 * Math.PI * carrier * i;
      this.kernelRe[i] = w * Math.cos(angle);
      this.kernelIm[i] = -w * Math.sin(angle);
      sumRe += this.kernelRe[i]!;
      sumIm += this.kernelIm[i]!;
    }
    this.kernelSumRe = sumRe;
    this.kernelSumIm = sumIm;
    this.kernelCarrier = carrier;
  }

  private measure(sumRe: number, sumIm: number, sum: number): void {
    const carrier = this.blockCarrier;
    const b = this.blockSamples;
    let re = sumRe;
    let im = sumIm;
    // Remove the block's DC, which the Hann kernel would otherwise let through a little.
    const mean = sum / b;
    re -= mean * this.kernelSumRe;
    im -= mean * this.kernelSumIm;
    // arg X = 2π·Θ(centre) − 2π·carrier·(B − 1)/2 for x = A·cos(2π·Θ).
    const measured = Math.atan2(im, re) / (2 * Math.PI) + carrier * ((b - 1) / 2);
    const magnitude = Math.hypot(re, im);
    this.strongest = Math.max(this.strongest, magnitude);
    let phase: number;
    if (this.count === 0) {
      phase = measured - Math.floor(measured);
    } else {
      const predicted = this.phases[this.count - 1]! + carrier * b;
      const difference = measured - predicted;
      // Under 1 % of the strongest fundamental so far (a load switched off): follow the carrier, not the noise's phase.
      phase = magnitude < WEAK_FRACTION * this.strongest ? predicted : predicted + (difference - Math.round(difference));
    }
    if (this.count === this.phases.length) {
      const grown = new Float64Array(2 * this.phases.length);
      grown.set(this.phases);
      this.phases = grown;
    }
    this.phases[this.count++] = phase;
  }
}
