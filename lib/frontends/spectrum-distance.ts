import type { FrontEndSpectrum } from "./types";

/** A measured current spectrum prepared for fitting. */
export interface MeasuredSpectrum {
  /** I_h / I_1 per order (index = order); NaN where the order was not measured. */
  magnitude: Float64Array;
  /** Phase of order h minus h × the voltage fundamental's phase (radians); NaN where unknown. */
  phaseRad: Float64Array;
  /** Highest order compared (≤ 50). */
  maxOrder: number;
  /** Whether phaseRad[1] is relative to a real voltage channel (else only the waveform shape is known). */
  hasVoltage: boolean;
}

/** Weight of the harmonic phase pattern (waveform shape) against the magnitudes. */
export const SHAPE_PHASE_WEIGHT = 0.1;
/** Weight of the fundamental's displacement angle, when a voltage channel exists. */
export const DISPLACEMENT_WEIGHT = 0.02;

/**
 * Fit error between a measured and a model spectrum, % of the fundamental:
 * 100·√( Σ_h (|m_h| − |M_h|)² + w_s·Σ_h |m_h||M_h|·4sin²(Δs_h/2) + w_1·4sin²(Δψ_1/2) ) over
 * h = 2..maxOrder, where s_h = ψ_h − h·ψ_1 is the phase pattern of the waveform shape (independent
 * of where the voltage is), and ψ_1 the displacement (only with a voltage channel). With w = 1 the
 * phase terms would make this the plain complex distance; smaller weights keep a shifted voltage
 * reference or supply distortion from dominating. O(maxOrder).
 *
 * @example spectrumDistancePercent(measured, FAMILY_MODELS.linear.spectrum({ displacementDeg: 0 })) // ≈ measured THD
 */
export function spectrumDistancePercent(measured: MeasuredSpectrum, model: FrontEndSpectrum): number {
  let sum = 0;
  const m1 = measured.phaseRad[1]!;
  const k1 = model.phaseRad[1]!;
  for (let h = 2; h <= measured.maxOrder; h++) {
    const m = measured.magnitude[h]!;
    if (Number.isNaN(m)) continue;
    const mm = model.magnitude[h]!;
    sum += (m - mm) ** 2;
    const mp = measured.phaseRad[h]!;
    if (!Number.isNaN(mp) && !Number.isNaN(m1) && m > 0 && mm > 0) {
      const d = mp - h * m1 - (model.phaseRad[h]! - h * k1);
      sum += SHAPE_PHASE_WEIGHT * m * mm * 4 * Math.sin(d / 2) ** 2;
    }
  }
  if (measured.hasVoltage && !Number.isNaN(m1)) sum += DISPLACEMENT_WEIGHT * 4 * Math.sin((m1 - k1) / 2) ** 2;
  return 100 * Math.sqrt(sum);
}
