// Where consecutive analysis windows start and end: each spans exactly 10 or 12 cycles of its own
// measured fundamental (IEC 61000-4-7 §4.4 / §5).
import type { PhaseTrack } from "./phase-tracker";

/** Longest window allowed to extend past the record, as a fraction of a window (IEC 61000-4-7 sync tolerance is ±0.03 %). */
const WINDOW_FIT_TOLERANCE = 1e-3;

/**
 * Cuts a record of `n` samples into consecutive windows of `cycles` cycles each, from the phase
 * track of its reference channel: window w spans the samples where the fundamental's phase goes
 * from Θ(0) + w·cycles to Θ(0) + (w + 1)·cycles, so every window is synchronised to the
 * fundamental it holds even when the grid drifts. Between block centres the phase is interpolated
 * linearly (a linear frequency ramp of 0.03 Hz/s moves a boundary by under 10⁻⁵ of a window);
 * beyond the first and last centres it is extended with the nearest pair's slope (with one
 * block, the carrier's). Boundaries are computed from Θ(0) + w·cycles, so rounding does not
 * accumulate. The last window may end up to {@link WINDOW_FIT_TOLERANCE} of a window past the record.
 *
 * Complexity O(blocks + windows).
 *
 * @returns window boundaries in samples (fractional): window w is [bounds[w], bounds[w + 1]); W + 1 numbers.
 * @example
 * scheduleWindows(track, 10, 64000) // Float64Array [0, 1280.2, 2560.5, …]
 */
export function scheduleWindows(track: PhaseTrack, cycles: number, n: number): Float64Array {
  const { blockSamples: b, phasesCycles: phases, firstCarrier } = track;
  const m = phases.length;
  const centre = (j: number): number => j * b + (b - 1) / 2;
  if (m === 0 && !(firstCarrier > 0)) throw new Error("scheduleWindows requires a phase track with a carrier");
  const firstSlope = m >= 2 ? (phases[1]! - phases[0]!) / b : firstCarrier;
  const lastSlope = m >= 2 ? (phases[m - 1]! - phases[m - 2]!) / b : firstCarrier;
  const phase0 = m === 0 ? 0 : phases[0]! - firstSlope * centre(0);
  const bounds: number[] = [0];
  let j = 0;
  /** The sample where the phase reaches `target` cycles (targets only increase). */
  const inverse = (target: number): number => {
    if (m === 0) return (target - phase0) / firstSlope;
    if (target <= phases[0]!) return centre(0) + (target - phases[0]!) / firstSlope;
    while (j + 1 < m && phases[j + 1]! < target) j++;
    if (j + 1 >= m) return centre(m - 1) + (target - phases[m - 1]!) / lastSlope;
    return centre(j) + ((target - phases[j]!) / (phases[j + 1]! - phases[j]!)) * b;
  };
  for (let w = 1; ; w++) {
    const end = inverse(phase0 + w * cycles);
    const start = bounds[w - 1]!;
    if (!(end <= n + WINDOW_FIT_TOLERANCE * (end - start))) break;
    bounds.push(end);
  }
  return Float64Array.from(bounds);
}
