import { FAMILY_MODELS } from "./families";
import { spectrumDistancePercent, type MeasuredSpectrum } from "./spectrum-distance";
import type { FrontEndFamily, FrontEndParameters } from "./types";

export interface FamilyFit {
  family: FrontEndFamily;
  parameters: FrontEndParameters;
  /** Fit error, % of the fundamental (see spectrumDistancePercent). */
  fitErrorPercent: number;
}

/**
 * Fits one family's parameters to a measured spectrum: every point of the family's coarse grid,
 * then a bounded pattern search (coordinate steps, halved on failure) from the best three.
 * Deterministic. Cost: grid size + ~3 × 80 spectrum evaluations.
 *
 * @example fitFamily(measured, "six-pulse-capacitor").parameters.acInductancePercent
 */
export function fitFamily(measured: MeasuredSpectrum, family: FrontEndFamily): FamilyFit {
  const model = FAMILY_MODELS[family];
  const specs = model.parameters;
  const cost = (x: number[]): number => {
    const params: FrontEndParameters = {};
    specs.forEach((s, k) => (params[s.name] = x[k]!));
    return spectrumDistancePercent(measured, model.spectrum(params));
  };

  const starts: { x: number[]; c: number }[] = [];
  const walk = (d: number, x: number[]): void => {
    if (d === specs.length) {
      starts.push({ x, c: cost(x) });
      return;
    }
    for (const v of specs[d]!.grid) walk(d + 1, [...x, v]);
  };
  walk(0, []);
  // Stable sort keeps the earlier grid point on ties.
  starts.sort((a, b) => a.c - b.c);

  let best = starts[0]!;
  for (const start of starts.slice(0, 3)) {
    let x = [...start.x];
    let c = start.c;
    const step = specs.map((s) => (s.max - s.min) / 8);
    for (let iter = 0; iter < 80; iter++) {
      let improved = false;
      for (let d = 0; d < specs.length; d++) {
        for (const dir of [1, -1]) {
          const y = [...x];
          y[d] = Math.min(specs[d]!.max, Math.max(specs[d]!.min, y[d]! + dir * step[d]!));
          if (y[d] === x[d]) continue;
          const cy = cost(y);
          if (cy < c - 1e-9) {
            x = y;
            c = cy;
            improved = true;
            break;
          }
        }
      }
      if (!improved) {
        for (let d = 0; d < step.length; d++) step[d] = step[d]! / 2;
        if (step.every((s, d) => s < (specs[d]!.max - specs[d]!.min) / 2000)) break;
      }
    }
    if (c < best.c) best = { x, c };
  }
  const parameters: FrontEndParameters = {};
  specs.forEach((s, k) => (parameters[s.name] = best.x[k]!));
  return { family, parameters, fitErrorPercent: best.c };
}
