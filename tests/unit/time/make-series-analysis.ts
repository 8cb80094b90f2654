// Builds AnalysisResult values with per-window order series (as the engine gives with
// includeOrderSeries) so time-rule tests do not depend on the analysis engine.
import type { AnalysisResult, ChannelResult, Quantity } from "@/lib/analysis/types";

export interface SeriesChannelSpec {
  name: string;
  quantity?: Quantity;
  /** Fundamental r.m.s. per window (A or V). */
  fundamental: number | ((k: number) => number);
  /** Harmonic r.m.s. per window by order; orders not listed are 0. */
  orders?: Record<number, (k: number) => number>;
}

/** An analysis of `windowCount` 10-cycle windows at 50 Hz (0.2 s each). */
export function makeSeriesAnalysis(windowCount: number, channels: SeriesChannelSpec[], maxOrder = 50): AnalysisResult {
  const built: ChannelResult[] = channels.map((spec) => {
    const quantity = spec.quantity ?? "current";
    const fundamental = typeof spec.fundamental === "number" ? () => spec.fundamental as number : spec.fundamental;
    const harmonicSeries: number[][] = [];
    for (let order = 1; order <= maxOrder; order++) {
      const f = order === 1 ? fundamental : spec.orders?.[order];
      harmonicSeries.push(Array.from({ length: windowCount }, (_, k) => (f ? f(k) : 0)));
    }
    const rmsOf = (values: number[]): number => Math.sqrt(values.reduce((sum, v) => sum + v * v, 0) / values.length);
    const harmonics = harmonicSeries.map((values, i) => {
      const rms = rmsOf(values);
      return { order: i + 1, rms, phaseDeg: 0, percentOfFundamental: (rms / rmsOf(harmonicSeries[0]!)) * 100 };
    });
    const total = Math.sqrt(harmonics.reduce((sum, h) => sum + (h.rms ?? 0) ** 2, 0));
    const fundamentalRms = harmonics[0]!.rms;
    return {
      name: spec.name,
      quantity,
      unit: quantity === "current" ? "A" : "V",
      phase: null,
      rms: total,
      dc: 0,
      fundamentalRms,
      thdPercent: (Math.sqrt(total ** 2 - fundamentalRms ** 2) / fundamentalRms) * 100,
      thdMaxOrder: 40,
      crestFactor: Math.SQRT2,
      kFactor: 1,
      harmonics,
      harmonicSeries,
    };
  });
  return {
    fundamentalHz: 50,
    nominalHz: 50,
    sampleIntervalS: 1 / 10240,
    durationS: windowCount * 0.2,
    window: { cycles: 10, points: 2048, count: windowCount },
    maxResolvableOrder: maxOrder,
    channels: built,
    power: { phases: [], total: null },
    warnings: [],
  };
}

/** Seconds → window index helper: value `inside` for windows in [fromS, toS), else `outside`. */
export function burst(fromS: number, toS: number, inside: number, outside: number): (k: number) => number {
  return (k) => (k * 0.2 >= fromS - 1e-9 && k * 0.2 < toS - 1e-9 ? inside : outside);
}
