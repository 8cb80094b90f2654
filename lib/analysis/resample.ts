// Band-limited resampling of one window onto 2^k points: a Kaiser-windowed sinc evaluated at
// arbitrary positions (table with linear interpolation), stretched into a low-pass when the
// window is decimated. Linear interpolation would lose 12–41 % at orders 25–50 at 128 samples
// per cycle; this kernel stays within 0.02 % there (measured: ≤ 0.015 % up to 80 % of the cutoff).

/**
 * Half-width of the kernel: 16 (32 taps, flat to 80 % of the cutoff) when upsampling, where the
 * highest orders can sit close to the source Nyquist frequency; 8 when decimating, where the
 * orders of interest are far below the output Nyquist frequency (flat to 65 % of it).
 */
export const KERNEL_HALF_WIDTH = 16;
export const DECIMATION_HALF_WIDTH = 8;
/** Fraction of the cutoff up to which the passband is flat within ±0.02 % (measured), per half-width. */
export const PASSBAND_FRACTION: Record<number, number> = { 16: 0.8, 8: 0.65 };
const KAISER_BETA = 8;
/** Relative excess of a window over its points still treated as 1:1 (0.1 %, the window fit tolerance). */
export const STEP_SLACK = 1e-3;
const TABLE_STEPS_PER_SAMPLE = 512;

const tables = new Map<number, Float64Array>();

function besselI0(x: number): number {
  let sum = 1;
  let term = 1;
  for (let k = 1; k < 50; k++) {
    term *= (x / (2 * k)) ** 2;
    sum += term;
    if (term < 1e-17 * sum) break;
  }
  return sum;
}

/** Half-width used for a given step (source samples per output point). */
export function kernelHalfWidth(stepSamples: number): number {
  // A window a hair longer than its 2^k points (a tracked window of exactly 2^k samples ± jitter) is not decimated.
  return stepSamples > 1 + STEP_SLACK ? DECIMATION_HALF_WIDTH : KERNEL_HALF_WIDTH;
}

/** h(u − K) for u = 0..2K in steps of 1/TABLE_STEPS_PER_SAMPLE (plus one guard entry). */
function kernelTable(halfWidth: number): Float64Array {
  const cached = tables.get(halfWidth);
  if (cached) return cached;
  const size = 2 * halfWidth * TABLE_STEPS_PER_SAMPLE + 2;
  const values = new Float64Array(size);
  const norm = besselI0(KAISER_BETA);
  for (let i = 0; i < size - 1; i++) {
    const d = i / TABLE_STEPS_PER_SAMPLE - halfWidth;
    const r = d / halfWidth;
    const window = Math.abs(r) >= 1 ? 0 : besselI0(KAISER_BETA * Math.sqrt(1 - r * r)) / norm;
    const sinc = d === 0 ? 1 : Math.sin(Math.PI * d) / (Math.PI * d);
    values[i] = sinc * window;
  }
  tables.set(halfWidth, values);
  return values;
}

/** Coefficients that map source samples onto the output points of one window. */
export interface ResamplePlan {
  points: number;
  taps: number;
  /** Index in the source of each output point's first tap. */
  firstIndex: Int32Array;
  /** points × taps coefficients. */
  coefficients: Float64Array;
}

/**
 * Computes resampling coefficients for output points at source positions
 * `startIndex + m·stepSamples`, m = 0..points−1. When `stepSamples` > 1 (decimation) the sinc is
 * stretched so its cutoff is the output Nyquist frequency (anti-aliasing); otherwise the cutoff is
 * the source Nyquist frequency. The passband is flat (±0.02 %) to {@link PASSBAND_FRACTION} of the cutoff.
 * The plan is shared by all channels of a window.
 *
 * Complexity O(points × taps), taps = 32 when upsampling, 2·⌈8·stepSamples⌉ when decimating.
 *
 * @param reuse a previous plan of the same shape whose arrays may be overwritten.
 * @param halfWidth kernel half-width (default: {@link kernelHalfWidth} of the step); a capture fixes it once.
 * @example
 * const plan = planResample(20.3, 1280 / 2048, 2048); applyResample(plan, source, out);
 */
export function planResample(startIndex: number, stepSamples: number, points: number, reuse?: ResamplePlan, halfWidth = kernelHalfWidth(stepSamples)): ResamplePlan {
  const values = kernelTable(halfWidth);
  const stretch = Math.max(1, stepSamples);
  const taps = 2 * Math.ceil(halfWidth * stretch);
  const plan =
    reuse && reuse.points === points && reuse.taps === taps
      ? reuse
      : { points, taps, firstIndex: new Int32Array(points), coefficients: new Float64Array(points * taps) };
  const { firstIndex, coefficients } = plan;
  const invStretch = 1 / stretch;
  const maxU = 2 * halfWidth * TABLE_STEPS_PER_SAMPLE;
  for (let m = 0; m < points; m++) {
    const x = startIndex + m * stepSamples;
    const base = Math.floor(x);
    const first = base - taps / 2 + 1;
    firstIndex[m] = first;
    const offset = m * taps;
    for (let t = 0; t < taps; t++) {
      const d = x - (first + t);
      const u = (d * invStretch + halfWidth) * TABLE_STEPS_PER_SAMPLE;
      if (u <= 0 || u >= maxU) {
        coefficients[offset + t] = 0;
        continue;
      }
      const i = Math.floor(u);
      const a = u - i;
      const v0 = values[i]!;
      coefficients[offset + t] = (v0 + a * (values[i + 1]! - v0)) * invStretch;
    }
  }
  return plan;
}

/**
 * Applies a plan to one channel: out[m] = Σ_t source[firstIndex[m] + t] · coefficient[m][t].
 * The source must cover every index the plan touches (pad the window edges beforehand).
 *
 * Complexity O(points × taps).
 *
 * @example
 * applyResample(plan, paddedWindow, out);
 */
export function applyResample(plan: ResamplePlan, source: Float64Array, out: Float64Array): void {
  const { points, taps, firstIndex, coefficients } = plan;
  for (let m = 0; m < points; m++) {
    const first = firstIndex[m]!;
    const offset = m * taps;
    let sum = 0;
    for (let t = 0; t < taps; t++) sum += source[first + t]! * coefficients[offset + t]!;
    out[m] = sum;
  }
}
