// Builds AnalysisResult values by hand so compliance tests do not depend on the analysis engine.
import type { AnalysisResult, ChannelResult, Quantity } from "@/lib/analysis/types";

export interface ChannelSpec {
  name: string;
  quantity?: Quantity;
  phase?: string | null;
  /** Fundamental r.m.s. (A or V). */
  fundamentalRms: number;
  /** Harmonic r.m.s. values by order (A or V); orders not listed are 0. */
  harmonics?: Record<number, number>;
  /** Highest order listed in harmonics[] (default 50). */
  maxOrder?: number;
}

export interface AnalysisSpec {
  channels: ChannelSpec[];
  /** Orders above this have rms null (above Nyquist). Default 50. */
  maxResolvableOrder?: number;
  power?: AnalysisResult["power"];
}

/** An AnalysisResult whose channels carry exactly the given harmonic values. */
export function makeAnalysis(spec: AnalysisSpec): AnalysisResult {
  const maxResolvableOrder = spec.maxResolvableOrder ?? 50;
  const channels: ChannelResult[] = spec.channels.map((channel) => {
    const quantity = channel.quantity ?? "current";
    const maxOrder = channel.maxOrder ?? 50;
    const harmonics = [];
    let sumSquares = channel.fundamentalRms ** 2;
    let distortionSquares = 0;
    for (let order = 1; order <= maxOrder; order += 1) {
      const resolvable = order <= maxResolvableOrder;
      const rms = order === 1 ? channel.fundamentalRms : (channel.harmonics?.[order] ?? 0);
      if (order > 1 && resolvable) {
        sumSquares += rms * rms;
        distortionSquares += rms * rms;
      }
      harmonics.push({
        order,
        rms: resolvable ? rms : null,
        phaseDeg: resolvable ? 0 : null,
        percentOfFundamental: resolvable ? (rms / channel.fundamentalRms) * 100 : null,
      });
    }
    return {
      name: channel.name,
      quantity,
      unit: quantity === "current" ? "A" : "V",
      phase: channel.phase ?? null,
      rms: Math.sqrt(sumSquares),
      dc: 0,
      fundamentalRms: channel.fundamentalRms,
      thdPercent: (Math.sqrt(distortionSquares) / channel.fundamentalRms) * 100,
      thdMaxOrder: Math.min(40, maxResolvableOrder),
      crestFactor: Math.SQRT2,
      kFactor: 1,
      harmonics,
    };
  });
  return {
    fundamentalHz: 50,
    nominalHz: 50,
    sampleIntervalS: 1 / 10240,
    durationS: 2,
    window: { cycles: 10, points: 2048, count: 10 },
    maxResolvableOrder,
    channels,
    power: spec.power ?? { phases: [], total: null },
    warnings: [],
  };
}
