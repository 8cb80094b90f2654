import { MAX_ORDER, type FrontEndSpectrum } from "./types";

/** Share of the low-order residual per order (normalised to unit r.s.s. below). Common practice, no source. */
const LOW_ORDER_SHAPE: ReadonlyArray<[number, number]> = [
  [2, 0.15],
  [3, 0.3],
  [5, 0.6],
  [7, 0.5],
  [11, 0.35],
  [13, 0.3],
];
const LOW_ORDER_NORM = Math.sqrt(LOW_ORDER_SHAPE.reduce((s, [, w]) => s + w * w, 0));

/**
 * Line-current spectrum of a PWM active front end with sinusoidal current control: a unity
 * displacement fundamental, a small low-order residual (control and supply imperfections) and
 * sidebands at the switching order ± 2 and ± 4 when these fall on orders ≤ 50 (a two-level
 * converter's line current has its carrier sidebands there; common practice, no source).
 * Closed form, no simulation.
 *
 * @param lowOrderResidualPercent r.s.s. of orders 2–13, % of fundamental
 * @param switchingOrder switching frequency / fundamental (rounded; above 54 no sideband is ≤ 50)
 * @param sidebandPercent each of the two main sidebands (order ± 2), % of fundamental; ± 4 carry 30 % of it
 * @example activeFrontEndSpectrum(3, 40, 2).magnitude[38] // 0.02
 */
export function activeFrontEndSpectrum(lowOrderResidualPercent: number, switchingOrder: number, sidebandPercent: number): FrontEndSpectrum {
  const magnitude = new Float64Array(MAX_ORDER + 1);
  const phaseRad = new Float64Array(MAX_ORDER + 1);
  magnitude[1] = 1;
  for (const [h, w] of LOW_ORDER_SHAPE) magnitude[h] = (lowOrderResidualPercent / 100) * (w / LOW_ORDER_NORM);
  const m = Math.round(switchingOrder);
  for (const [offset, share] of [[-4, 0.3], [-2, 1], [2, 1], [4, 0.3]] as const) {
    const h = m + offset;
    if (h >= 2 && h <= MAX_ORDER) magnitude[h] = magnitude[h]! + (sidebandPercent / 100) * share;
  }
  return { magnitude, phaseRad };
}
