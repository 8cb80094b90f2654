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

/**
 * A clean multi-tone whose fundamental ramps linearly from `startHz` by `rampHz` over the record:
 * f(t) = startHz + rampHz·t/T, so the fundamental's phase is θ(t) = 2π(startHz·t + rampHz·t²/(2T))
 * (the integral of the frequency) and order h is amplitudes[h]·cos(h·θ + phases[h]). The r.m.s. of
 * order h is amplitudes[h]/√2 at every instant (Fourier series of a periodic wave; textbook).
 */
export function rampingMultiTone(startHz: number, rampHz: number, rateHz: number, seconds: number, amplitudes: number[], phases: number[]): Float64Array {
  const n = Math.round(seconds * rateHz);
  const samples = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    const t = k / rateHz;
    const theta = 2 * Math.PI * (startHz * t + (rampHz * t * t) / (2 * seconds));
    let v = 0;
    for (let h = 1; h < amplitudes.length; h++) if (amplitudes[h]) v += amplitudes[h]! * Math.cos(h * theta + phases[h]!);
    samples[k] = v;
  }
  return samples;
}

/**
 * A four-channel capture as CSV text ("Time (s),Va (V),Ia (A),Vb (V),Ib (A)"): Va, Ia, Vb, Ib at
 * `rateHz`, fundamental drifting 49.9 → 50.1 Hz over the record (phase = 2π(49.9·t + 0.1·t²/T)),
 * 5th/7th/11th harmonics, a DC offset on Ia and Ib clipped at ±11 A (so the DC-offset and clipping
 * warnings appear). The first `padFirst` rows have every cell padded with spaces to 40 characters
 * (a head that promises fewer rows than the file holds).
 */
export function driftingCaptureText(seconds: number, rateHz: number, padFirst = 0): string {
  const rows = Math.round(seconds * rateHz);
  const lines = ["Time (s),Va (V),Ia (A),Vb (V),Ib (A)"];
  const b = (-2 * Math.PI) / 3;
  for (let k = 0; k < rows; k++) {
    const t = k / rateHz;
    // Frequency ramps linearly by 0.2 Hz over the record: phase = 2π(49.9·t + 0.1·t²/seconds).
    const phase = 2 * Math.PI * (49.9 * t + (0.1 * t * t) / seconds);
    const va = 325 * Math.cos(phase) + 6 * Math.cos(5 * phase + 0.3);
    const vb = 325 * Math.cos(phase + b) + 6 * Math.cos(5 * (phase + b) + 0.3);
    const ia = 0.4 + 10 * Math.cos(phase - 0.6) + 2 * Math.cos(5 * phase - 1) + 1.2 * Math.cos(7 * phase + 0.5) + 0.4 * Math.cos(11 * phase);
    const ibRaw = 10 * Math.cos(phase + b - 0.6) + 2 * Math.cos(5 * (phase + b) - 1);
    const ib = Math.max(-11, Math.min(11, ibRaw));
    const cells = [t.toFixed(7), va.toFixed(2), ia.toFixed(4), vb.toFixed(2), ib.toFixed(4)];
    lines.push(k < padFirst ? cells.map((c) => c.padStart(40)).join(",") : cells.join(","));
  }
  return `${lines.join("\n")}\n`;
}
