// Frequency segments: the stretches of a record over which one estimate of the fundamental is the
// carrier of its phase tracking.

/** Default frequency segment: 2^18 samples ≈ 10 s at 25.6 kS/s. */
export const FREQUENCY_SEGMENT_SAMPLES = 1 << 18;

/**
 * Splits a record of `n` samples into frequency segments of `segmentSamples`; the last segment
 * takes the remainder (so it holds between one and two segments' worth). Returns the starts plus n.
 *
 * @example
 * segmentBounds(10, 4) // [0, 4, 10]
 */
export function segmentBounds(n: number, segmentSamples: number): number[] {
  const count = Math.max(1, Math.floor(n / segmentSamples));
  const bounds = Array.from({ length: count }, (_, k) => k * segmentSamples);
  bounds.push(n);
  return bounds;
}
