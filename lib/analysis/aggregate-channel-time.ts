import { aggregateIntervals } from "./aggregate-intervals";
import { planIntervals } from "./plan-intervals";
import { seriesStatistics, type SeriesStatistics } from "./series-statistics";
import { smoothFirstOrder } from "./smooth-first-order";
import type { AnalysisResult, ChannelResult } from "./types";

/** Time aggregation of one order of one channel; values in the channel's unit (A or V). */
export interface OrderTimeAggregation {
  order: number;
  /** Per-window (10/12-cycle) statistics. */
  window: SeriesStatistics;
  /** 1.5 s smoothed window values (IEC 61000-4-7). */
  smoothed: { values: Float64Array; stats: SeriesStatistics };
  /** 150/180-cycle (≈ 3 s) values; null when fewer than 15 windows. */
  veryShort: { values: Float64Array; stats: SeriesStatistics } | null;
  /** 10-minute values with their start times (s); null when no complete interval. */
  short: { values: Float64Array; startS: Float64Array; stats: SeriesStatistics } | null;
}

export interface ChannelTimeAggregation {
  channel: string;
  /** Duration of one window, s (window cycles / fundamental). */
  windowS: number;
  windowCount: number;
  /** How 10-minute intervals were aligned (see planIntervals). */
  align: "clock" | "record-start";
  orders: OrderTimeAggregation[];
}

/**
 * Per-order time aggregation of one channel of an analysis run with `includeOrderSeries`:
 * window values, their 1.5 s smoothing (IEC 61000-4-7), 150/180-cycle values (r.m.s. of 15
 * consecutive windows) and 10-minute values (r.m.s. of the window values in each interval),
 * with mean, max, p95 and p99 of each (IEC 61000-4-30 aggregation, from memory).
 *
 * 10-minute intervals are aligned to the UTC 10-minute tick when `startEpochMs` (the time of the
 * first window) is given, otherwise counted from the record start; partial intervals at the
 * edges are not used. Complexity O(orders × windows). Throws when the channel has no order series.
 *
 * @example
 * const time = aggregateChannelTime(analysis, "Ia (A)");
 * time.orders.find((o) => o.order === 5)?.smoothed.stats.max // A
 */
export function aggregateChannelTime(
  analysis: AnalysisResult,
  channelName: string,
  options: { startEpochMs?: number; orders?: number[] } = {},
): ChannelTimeAggregation {
  const channel: ChannelResult | undefined = analysis.channels.find((candidate) => candidate.name === channelName);
  if (!channel) throw new Error(`aggregateChannelTime: channel "${channelName}" not found`);
  if (!channel.harmonicSeries) throw new Error("aggregateChannelTime requires per-window order series (analyse with includeOrderSeries)");
  const windowS = analysis.window.cycles / analysis.fundamentalHz;
  const windowCount = analysis.window.count;
  const startsS =
    options.startEpochMs === undefined ? undefined : Float64Array.from({ length: windowCount }, (_, k) => options.startEpochMs! / 1000 + k * windowS);
  const align = options.startEpochMs === undefined ? "record-start" : "clock";
  const veryShortPlan = planIntervals(windowCount, { groupSize: 15, valueS: windowS });
  const shortPlan = planIntervals(windowCount, { intervalS: 600, valueS: windowS, startsS, align });
  const orders: OrderTimeAggregation[] = [];
  channel.harmonicSeries.forEach((series, index) => {
    const order = index + 1;
    if (!series || series.length === 0 || (options.orders && !options.orders.includes(order))) return;
    const smoothed = smoothFirstOrder(series, windowS);
    const veryShort = aggregateIntervals(series, veryShortPlan);
    const short = aggregateIntervals(series, shortPlan);
    orders.push({
      order,
      window: seriesStatistics(series),
      smoothed: { values: smoothed, stats: seriesStatistics(smoothed) },
      veryShort: veryShort.length > 0 ? { values: veryShort, stats: seriesStatistics(veryShort) } : null,
      short: short.length > 0 ? { values: short, startS: shortPlan.intervalStartS, stats: seriesStatistics(short) } : null,
    });
  });
  return { channel: channel.name, windowS, windowCount, align, orders };
}
