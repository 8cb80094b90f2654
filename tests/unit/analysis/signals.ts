// Test signal helpers: time-domain waveforms sampled point by point, and a seeded PRNG.

export { mulberry32 } from "../../../fixtures/mulberry32";

/**
 * Quasi-square wave of height `id` at sample `k` of `perCycle` samples per cycle: +id within β/2 of
 * 90°, −id within β/2 of 270°, 0 elsewhere, and the mid value exactly on an edge (where the Fourier
 * series converges). β = 180° is the square wave. Integer sample positions make edges exact.
 */
export function quasiSquareAt(k: number, perCycle: number, betaDeg: number, id = 1): number {
  const pos = ((k % perCycle) + perCycle) % perCycle;
  const deg = (pos * 360) / perCycle;
  const half = betaDeg / 2;
  const level = (centre: number): number => {
    const raw = Math.abs(deg - centre) % 360;
    const d = Math.min(raw, 360 - raw);
    if (Math.abs(d - half) < 1e-9) return 0.5;
    return d < half ? 1 : 0;
  };
  return id * (level(90) - level(270));
}
