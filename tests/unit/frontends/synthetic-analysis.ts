// Builds an AnalysisResult whose current channel carries a given front-end spectrum (for tests).
import type { AnalysisResult, ChannelResult } from "@/lib/analysis/types";
import type { FrontEndSpectrum } from "@/lib/frontends/types";
import { mulberry32 } from "../../../fixtures/mulberry32";

/**
 * A capture with a voltage "Va" (phase φ_V) and a current "Ia" of `fundamentalA` whose spectrum is
 * `spectrum` with multiplicative magnitude noise of ±noise (uniform, seeded) and ±noise rad phase noise.
 */
export function syntheticAnalysis(spectrum: FrontEndSpectrum, options: { noise?: number; seed?: number; fundamentalA?: number; withVoltage?: boolean } = {}): AnalysisResult {
  const rnd = mulberry32(options.seed ?? 1);
  const noise = options.noise ?? 0;
  const i1 = options.fundamentalA ?? 100;
  const voltagePhaseDeg = 17;
  const harmonics = [];
  for (let h = 1; h <= 50; h++) {
    const m = spectrum.magnitude[h]! * (h === 1 ? 1 : 1 + noise * (2 * rnd() - 1));
    const ph = spectrum.phaseRad[h]! + (h === 1 ? 0 : noise * (2 * rnd() - 1));
    harmonics.push({ order: h, rms: m * i1, phaseDeg: (ph * 180) / Math.PI + h * voltagePhaseDeg, percentOfFundamental: 100 * m });
  }
  const thd = 100 * Math.sqrt(harmonics.slice(1).reduce((s, x) => s + (x.rms / i1) ** 2, 0));
  const base = { phase: "a", dc: 0, thdMaxOrder: 50, crestFactor: 1.41, kFactor: 1 };
  const current: ChannelResult = { ...base, name: "Ia", quantity: "current", unit: "A", rms: i1 * Math.sqrt(1 + (thd / 100) ** 2), fundamentalRms: i1, thdPercent: thd, harmonics };
  const voltage: ChannelResult = {
    ...base,
    name: "Va",
    quantity: "voltage",
    unit: "V",
    rms: 230,
    fundamentalRms: 230,
    thdPercent: 0,
    harmonics: Array.from({ length: 50 }, (_, k) => ({ order: k + 1, rms: k === 0 ? 230 : 0, phaseDeg: k === 0 ? voltagePhaseDeg : 0, percentOfFundamental: k === 0 ? 100 : 0 })),
  };
  const withVoltage = options.withVoltage ?? true;
  return {
    fundamentalHz: 50,
    nominalHz: 50,
    sampleIntervalS: 1 / 12800,
    durationS: 1,
    window: { cycles: 10, points: 4096, count: 5 },
    maxResolvableOrder: 128,
    channels: withVoltage ? [voltage, current] : [current],
    power: {
      phases: withVoltage ? [{ voltage: "Va", current: "Ia", phase: "a", activePowerW: 0, apparentPowerVA: 0, displacementFactor: 1, distortionFactor: 1, truePowerFactor: 1 }] : [],
      total: null,
    },
    warnings: [],
  };
}
