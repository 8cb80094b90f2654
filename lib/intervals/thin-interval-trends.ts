// Interval-log trend series cut to what a chart can show: a month of 1-minute values is 43,200
// points per series; a chart a few hundred pixels wide needs about 2,000.
import type { IntervalTrend, IntervalTrendSeries } from "./types";

/** At most this many points per series are stored and sent to the charts. */
export const maxTrendPoints = 2000;

/**
 * Thins every series of the trends to at most `maxPoints` points: consecutive rows are grouped
 * (⌈rows / maxPoints⌉ per point), each point is the group's largest value (so a short excursion
 * over a limit stays visible) at the group's first timestamp. `rowsPerPoint` says how many rows
 * stand behind each point (1: not thinned). Limits are kept as they are.
 *
 * Complexity O(series × rows).
 *
 * @example
 * thinIntervalTrends([{ channel: "I1", timestampsMs: [0, 1, 2, 3], orders: [{ name: "h5", unit: "%IL", values: [1, 4, 2, 3], limit: 7, ruleLimits: [] }], aggregates: [] }], 2)
 * // [{ channel: "I1", rowsPerPoint: 2, timestampsMs: [0, 2], orders: [{ …, values: [4, 3] }], aggregates: [] }]
 */
export function thinIntervalTrends(trends: IntervalTrend[], maxPoints = maxTrendPoints): IntervalTrend[] {
  return trends.map((trend) => {
    const rows = trend.timestampsMs.length;
    const size = Math.max(1, Math.ceil(rows / maxPoints));
    if (size === 1) return { ...trend, rowsPerPoint: 1 };
    const thin = (series: IntervalTrendSeries): IntervalTrendSeries => {
      const values: number[] = [];
      for (let start = 0; start < rows; start += size) {
        let max = -Infinity;
        for (let k = start; k < Math.min(rows, start + size); k++) max = Math.max(max, series.values[k]!);
        values.push(max);
      }
      return { ...series, values };
    };
    const timestampsMs: number[] = [];
    for (let start = 0; start < rows; start += size) timestampsMs.push(trend.timestampsMs[start]!);
    return { channel: trend.channel, rowsPerPoint: size, timestampsMs, orders: trend.orders.map(thin), aggregates: trend.aggregates.map(thin) };
  });
}
