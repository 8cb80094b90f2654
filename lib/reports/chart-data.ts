// The charts' data of one evaluation, built once when the evaluation is stored (not per request).
import type { AnalysisResult } from "@/lib/analysis/types";
import type { ComplianceResult } from "@/lib/compliance/result";
import type { IntervalTrend } from "@/lib/intervals/evaluate-interval-log";
import { decimateSeries } from "./decimate-series";

/**
 * Waveform, spectrum, per-window THD/rms series and the thinned per-order trends of the orders the
 * evaluation judged (so the payload stays small), for the sheet's charts. Pure; O(channels × judged
 * orders × windows) for the trends.
 *
 * @example
 * buildChartData({ analysis, waveform: null, trends: null, evaluation: result }).channels[0]?.harmonics[2]?.order // 3
 */
export function buildChartData({
  analysis,
  waveform,
  trends,
  evaluation,
}: {
  analysis: AnalysisResult;
  waveform: { timeS: number[]; channels: { name: string; values: number[] }[] } | null;
  trends: IntervalTrend[] | null;
  evaluation: ComplianceResult | null;
}) {
  const windowDurationS = analysis.window.cycles / analysis.fundamentalHz;
  const judged = new Map<string, number[]>();
  for (const c of evaluation?.channels ?? []) judged.set(c.channel, c.rows.filter((row) => row.limit !== null).map((row) => row.order));
  return {
    fundamentalHz: analysis.fundamentalHz,
    windowDurationS,
    waveform,
    intervalTrends: trends ?? null,
    channels: analysis.channels.map((c) => {
      const orders = judged.get(c.name) ?? [];
      return {
        name: c.name,
        quantity: c.quantity,
        unit: c.unit,
        harmonics: c.harmonics.map((h) => ({ order: h.order, rms: h.rms, percentOfFundamental: h.percentOfFundamental })),
        series: c.series ?? null,
        harmonicSeries: c.harmonicSeries && orders.length > 0 ? decimateSeries(c.harmonicSeries, orders, windowDurationS) : null,
      };
    }),
  };
}

export type ChartData = ReturnType<typeof buildChartData>;
