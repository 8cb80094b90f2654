// Power quantities of one voltage–current pair from whole-capture aggregates.
import type { Phasor } from "./sequence";

/** Inputs aggregated over the analysed windows of one pair. */
export interface PairAggregates {
  /** Mean over windows of mean(v·i): active power from the samples, W. */
  activePowerW: number;
  voltageRms: number;
  currentRms: number;
  currentFundamentalRms: number;
  /** Σ over windows of V1·conj(I1): its angle is the displacement angle. */
  fundamentalProduct: Phasor;
}

/** Power factors of a pair; see `PowerPhase` for the sign convention. */
export interface PairPower {
  activePowerW: number;
  apparentPowerVA: number;
  displacementAngleDeg: number;
  displacementFactor: number;
  distortionFactor: number;
  truePowerFactor: number;
}

/**
 * Computes S = Vrms·Irms, the displacement angle θ = ∠V1 − ∠I1 (positive: current lags),
 * displacement factor |cos θ| signed + lagging / − leading, distortion factor I1/Irms and
 * true power factor P/S (negative when power flows towards the source).
 * With a sinusoidal voltage, true PF = cos θ · I1/Irms (IEEE 1459-2010 §3.2; any power-electronics text).
 *
 * Complexity O(1).
 *
 * @example
 * pairPower({ activePowerW: 900, voltageRms: 100, currentRms: 10, currentFundamentalRms: 10, fundamentalProduct: { re: 0.9, im: 0.436 } })
 * // { apparentPowerVA: 1000, displacementFactor: 0.9, truePowerFactor: 0.9, … }
 */
export function pairPower(a: PairAggregates): PairPower {
  const apparentPowerVA = a.voltageRms * a.currentRms;
  const angle = Math.atan2(a.fundamentalProduct.im, a.fundamentalProduct.re);
  const displacementAngleDeg = (angle * 180) / Math.PI;
  const magnitude = Math.abs(Math.cos(angle));
  return {
    activePowerW: a.activePowerW,
    apparentPowerVA,
    displacementAngleDeg,
    displacementFactor: displacementAngleDeg < 0 ? -magnitude : magnitude,
    distortionFactor: a.currentRms > 0 ? a.currentFundamentalRms / a.currentRms : 0,
    truePowerFactor: apparentPowerVA > 0 ? a.activePowerW / apparentPowerVA : 0,
  };
}
