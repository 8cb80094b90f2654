import { MAX_ORDER, type FrontEndSpectrum } from "./types";

/**
 * Line-current spectrum of a single-phase bridge that conducts a flat current for a width β
 * centred on each voltage peak (quasi-square wave). Closed form (Fourier series of a rectangular
 * pulse): odd orders only, c_h ∝ sin(hβ/2)/h, in phase with the voltage or opposite.
 *
 * @param conductionWidthDeg β in degrees, 1–180
 * @example symmetricalAngleSpectrum(120).magnitude[3] // 0 (triplens vanish)
 */
export function symmetricalAngleSpectrum(conductionWidthDeg: number): FrontEndSpectrum {
  if (!(conductionWidthDeg > 0 && conductionWidthDeg <= 180)) throw new Error("conduction width β must be in (0°, 180°]");
  const beta = (conductionWidthDeg * Math.PI) / 180;
  const magnitude = new Float64Array(MAX_ORDER + 1);
  const phaseRad = new Float64Array(MAX_ORDER + 1);
  const c1 = Math.sin(beta / 2);
  for (let h = 1; h <= MAX_ORDER; h += 2) {
    const c = Math.sin((h * beta) / 2) / h / c1;
    magnitude[h] = Math.abs(c) < 1e-12 ? 0 : Math.abs(c);
    phaseRad[h] = c < -1e-12 ? Math.PI : 0;
  }
  return { magnitude, phaseRad };
}
