import { MAX_ORDER, type FrontEndSpectrum } from "./types";

/**
 * A spectrum from complex Fourier coefficients c_h (index = order, any common scale), normalised
 * to the fundamental: magnitude |c_h|/|c_1|, phase arg c_h (radians, cosine convention).
 *
 * @param re real parts, length ≥ MAX_ORDER + 1
 * @param im imaginary parts, length ≥ MAX_ORDER + 1
 * @example complexSpectrum(re, im).magnitude[5]
 */
export function complexSpectrum(re: ArrayLike<number>, im: ArrayLike<number>): FrontEndSpectrum {
  const fundamental = Math.hypot(re[1]!, im[1]!);
  const magnitude = new Float64Array(MAX_ORDER + 1);
  const phaseRad = new Float64Array(MAX_ORDER + 1);
  for (let h = 1; h <= MAX_ORDER; h++) {
    const m = Math.hypot(re[h]!, im[h]!);
    magnitude[h] = fundamental > 0 ? m / fundamental : 0;
    phaseRad[h] = m > 1e-15 * Math.max(fundamental, 1e-300) ? Math.atan2(im[h]!, re[h]!) : 0;
  }
  return { magnitude, phaseRad };
}
