import { shootSteadyState } from "./shoot-steady-state";
import { spectrumOfCycle } from "./spectrum-of-cycle";
import type { FrontEndSpectrum } from "./types";

/** Integrator steps per supply cycle. */
export const SINGLE_PHASE_STEPS_PER_CYCLE = 1200;

export interface SinglePhaseCapacitorInput {
  /** Source + line inductance, % on the load's base (ωL/Z_base, Z_base = V²/P). */
  lineInductancePercent: number;
  /** DC capacitor as ωC·Z_base (larger → smaller DC ripple; electronics supplies ≈ 5–50). */
  capacitorPu: number;
}

/**
 * Steady-state line current of a single-phase diode bridge with a DC capacitor and a resistive
 * load equal to the base power, simulated in the time domain, and its spectrum.
 *
 * Per unit: e = cos θ (peak 1), base power V_rms·I_base = 0.5 with Z_base = 1; the load is a
 * resistor R = 2, which draws about the base power at the usual DC voltage of 0.9–1.0 × peak.
 * The bridge connects the capacitor with the sign of the line
 * current; with no current it starts to conduct when |e| exceeds the capacitor voltage.
 * Integrator: semi-implicit Euler, fixed step 2π/1200 rad; a diode turns off when its current
 * would cross zero. Steady state by shooting on the capacitor voltage (secant), one recorded cycle.
 *
 * @example simulateSinglePhaseCapacitor({ lineInductancePercent: 0.5, capacitorPu: 20 }).magnitude[3]
 */
export function simulateSinglePhaseCapacitor(input: SinglePhaseCapacitorInput): FrontEndSpectrum {
  const l = Math.max(input.lineInductancePercent, 0.05) / 100;
  const c = Math.max(input.capacitorPu, 0.5);
  const r = 1 / 0.5;
  const n = SINGLE_PHASE_STEPS_PER_CYCLE;
  const dt = (2 * Math.PI) / n;
  let i = 0;
  let vc = 0.9;
  const record = new Float64Array(n);
  const runCycle = (rec: Float64Array | null): void => {
    for (let k = 0; k < n; k++) {
      const e = Math.cos(k * dt);
      let sign = i > 0 ? 1 : i < 0 ? -1 : 0;
      if (sign === 0 && Math.abs(e) > vc) sign = e > 0 ? 1 : -1;
      if (sign !== 0) {
        const next = i + (dt * (e - sign * vc)) / l;
        i = sign > 0 ? Math.max(next, 0) : Math.min(next, 0);
      }
      vc += (dt * (Math.abs(i) - vc / r)) / c;
      if (rec) rec[k] = i;
    }
  };
  shootSteadyState(() => runCycle(null), { get: () => vc, set: (v) => (vc = v) });
  runCycle(record);
  return spectrumOfCycle(record, 0);
}
