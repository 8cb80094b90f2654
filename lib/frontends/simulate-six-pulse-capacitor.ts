import { shootSteadyState } from "./shoot-steady-state";
import { spectrumOfCycle } from "./spectrum-of-cycle";
import type { FrontEndSpectrum } from "./types";

/** Integrator steps per supply cycle. */
export const SIX_PULSE_STEPS_PER_CYCLE = 1200;

/** DC-link capacitor of the modelled drive: ωC·Z_base (Z_base = V_phase/I_rated), a typical drive's size. */
export const SIX_PULSE_CAPACITOR_PU = 5;

export interface SixPulseCapacitorInput {
  /** AC-side inductance per phase (supply + line reactor), % on the drive's rated base (ωL/Z_base). */
  acInductancePercent: number;
  /**
   * DC choke, expressed as the AC-reactor percentage it replaces: L_dc = 2 × (Y/100) × Z_base/ω,
   * since two line inductances carry the DC current in series between commutations.
   */
  dcChokePercent: number;
  /** DC load as % of the rated power (constant resistance). */
  loadPercent: number;
}

/**
 * Steady-state line current of a three-phase diode bridge with a DC capacitor (the usual drive
 * front end), simulated in the time domain, and its spectrum.
 *
 * Circuit (per unit: phase voltage peak 1, ω = 1, rated current peak 1): e_a = cos θ,
 * e_b = cos(θ − 120°), e_c = cos(θ + 120°); each phase has inductance L to the bridge; a phase
 * with positive current connects to the + rail, negative to the − rail, zero floats and starts to
 * conduct when its voltage rises above the + rail (or below the − rail). The rails follow from the
 * inductor equations and the DC choke between bridge and capacitor C; a resistor R draws the load.
 * Integrator: semi-implicit Euler, fixed step 2π/1200 rad (currents first, then the capacitor
 * with the new currents); a diode turns off when its current would cross zero. Steady state by
 * shooting on the capacitor voltage (secant on the cycle-to-cycle map), then one recorded cycle.
 * Cost: ~10 cycles × 1200 steps.
 *
 * @example simulateSixPulseCapacitor({ acInductancePercent: 3, dcChokePercent: 0, loadPercent: 100 }).magnitude[5]
 */
export function simulateSixPulseCapacitor(input: SixPulseCapacitorInput): FrontEndSpectrum {
  return simulateSixPulseCapacitorCycle(input).spectrum;
}

/** The same simulation, returning the recorded cycle of phase-a current (per unit) as well. */
export function simulateSixPulseCapacitorCycle(input: SixPulseCapacitorInput): { spectrum: FrontEndSpectrum; currentA: Float64Array; dcVoltagePu: number } {
  const l = Math.max(input.acInductancePercent, 0.05) / 100;
  const ld = Math.max(2 * (input.dcChokePercent / 100), 1e-4);
  const c = SIX_PULSE_CAPACITOR_PU;
  // Rated DC power ≈ 3·V_rms·I_rated = 1.5 pu at V_dc ≈ √3.
  const load = Math.max(input.loadPercent, 1) / 100;
  const r = 3 / (1.5 * load);
  const n = SIX_PULSE_STEPS_PER_CYCLE;
  const dt = (2 * Math.PI) / n;
  const i = new Float64Array(3);
  const e = new Float64Array(3);
  const rail = new Int8Array(3); // +1 → + rail, −1 → − rail, 0 floating
  let vc = Math.sqrt(3) * 0.95;
  const record = new Float64Array(n);

  const runCycle = (rec: Float64Array | null): void => {
    for (let k = 0; k < n; k++) {
      const th = k * dt;
      e[0] = Math.cos(th);
      e[1] = Math.cos(th - (2 * Math.PI) / 3);
      e[2] = Math.cos(th + (2 * Math.PI) / 3);
      for (let p = 0; p < 3; p++) rail[p] = i[p]! > 0 ? 1 : i[p]! < 0 ? -1 : 0;
      let anyOn = rail[0] !== 0 || rail[1] !== 0 || rail[2] !== 0;
      if (!anyOn) {
        let hi = 0;
        let lo = 0;
        for (let p = 1; p < 3; p++) {
          if (e[p]! > e[hi]!) hi = p;
          if (e[p]! < e[lo]!) lo = p;
        }
        if (e[hi]! - e[lo]! > vc) {
          rail[hi] = 1;
          rail[lo] = -1;
          anyOn = true;
        }
      }
      let vp = 0;
      let vn = 0;
      if (anyOn) {
        for (let pass = 0; pass < 3; pass++) {
          let np = 0;
          let nn = 0;
          let ep = 0;
          let en = 0;
          for (let p = 0; p < 3; p++) {
            if (rail[p] === 1) {
              np++;
              ep += e[p]!;
            } else if (rail[p] === -1) {
              nn++;
              en += e[p]!;
            }
          }
          // a(E+ − n+·vp) = b(vp − vn − vc);  a(E− − n−·vn) = −b(vp − vn − vc); a = 1/L, b = 1/L_d.
          const a = 1 / l;
          const b = 1 / ld;
          const m11 = a * np + b;
          const m12 = -b;
          const m21 = -b;
          const m22 = a * nn + b;
          const r1 = a * ep + b * vc;
          const r2 = a * en - b * vc;
          const det = m11 * m22 - m12 * m21;
          vp = (r1 * m22 - m12 * r2) / det;
          vn = (m11 * r2 - m21 * r1) / det;
          let changed = false;
          for (let p = 0; p < 3; p++) {
            if (rail[p] !== 0) continue;
            if (e[p]! > vp + 1e-12) {
              rail[p] = 1;
              changed = true;
            } else if (e[p]! < vn - 1e-12) {
              rail[p] = -1;
              changed = true;
            }
          }
          if (!changed) break;
        }
        for (let p = 0; p < 3; p++) {
          if (rail[p] === 0) continue;
          const next = i[p]! + (dt * (e[p]! - (rail[p] === 1 ? vp : vn))) / l;
          i[p] = rail[p] === 1 ? Math.max(next, 0) : Math.min(next, 0);
        }
        // Keep Kirchhoff exact after a diode turned off: remove the residual from the phases still on.
        const sum = i[0]! + i[1]! + i[2]!;
        if (sum !== 0) {
          let pos = 0;
          let neg = 0;
          for (let p = 0; p < 3; p++) {
            if (i[p]! > 0) pos += i[p]!;
            else if (i[p]! < 0) neg -= i[p]!;
          }
          if (pos === 0 || neg === 0) i.fill(0);
          else if (sum > 0) for (let p = 0; p < 3; p++) i[p] = i[p]! > 0 ? i[p]! * (neg / pos) : i[p]!;
          else for (let p = 0; p < 3; p++) i[p] = i[p]! < 0 ? i[p]! * (pos / neg) : i[p]!;
        }
      }
      const idc = Math.max(i[0]!, 0) + Math.max(i[1]!, 0) + Math.max(i[2]!, 0);
      vc += (dt * (idc - vc / r)) / c;
      if (rec) rec[k] = i[0]!;
    }
  };

  // Steady state by shooting on the capacitor voltage.
  shootSteadyState(() => runCycle(null), { get: () => vc, set: (v) => (vc = v) });
  runCycle(record);
  return { spectrum: spectrumOfCycle(record, 0), currentA: record, dcVoltagePu: vc };
}
