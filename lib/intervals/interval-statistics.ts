// An interval log's headline values: what its columns say over the whole logged period.
import type { IntervalLogStatistics, IntervalValueStatistics, LoggedStatistic } from "../analysis/types";
import { summarizeWindows } from "../analysis/summarize-windows";
import { fundamentalSeries } from "./fundamental-series";
import type { IntervalLog } from "./types";

function statisticsOf(values: Float64Array | null, logged: LoggedStatistic | undefined): IntervalValueStatistics | null {
  if (!values || values.length === 0) return null;
  const { rmsMean, p95, max } = summarizeWindows(values, 0, 1, values.length);
  return { rmsMean, p95, max, logged: logged ?? "avg" };
}

/**
 * Each channel's logged values over every logged interval: r.m.s. mean (√ of the mean of squares),
 * 95th percentile (nearest rank) and maximum of the r.m.s. column, of the fundamental (the order-1
 * column, else r.m.s./√(1 + THD²) per interval), of the THD column (%), and of the distortion
 * THD × fundamental per interval (A or V; TDD is this divided by IL, a constant, so its statistics are
 * these divided by IL). A quantity the log has no column for is null ("not logged" on the sheet);
 * nothing is estimated from the individually logged orders, which rarely cover the THD's order range.
 * Each value names the logger's own per-interval statistic of its column (e.g. `avg`).
 * O(channels × rows).
 *
 * @example intervalStatistics(log).channels[0]?.thdPercent?.p95 // 14.2
 */
export function intervalStatistics(log: IntervalLog): IntervalLogStatistics {
  const rowCount = log.timestampsMs.length;
  return {
    intervalS: log.intervalS,
    rowCount,
    startMs: log.timestampsMs[0] ?? 0,
    endMs: rowCount > 0 ? log.timestampsMs[rowCount - 1]! + log.intervalS * 1000 : 0,
    channels: log.channels.map((channel) => {
      const fundamental = fundamentalSeries(channel);
      // Derived from r.m.s. and THD when order 1 is not logged: its values are of the r.m.s. column's kind.
      const fundamentalLogged = channel.orders.has(1) ? channel.logged?.fundamental : channel.logged?.rms;
      const distortion =
        channel.thdPercent && fundamental ? Float64Array.from(channel.thdPercent, (thd, k) => (thd / 100) * fundamental[k]!) : null;
      return {
        name: channel.name,
        quantity: channel.quantity,
        unit: channel.unit,
        rms: statisticsOf(channel.rms, channel.logged?.rms),
        fundamental: statisticsOf(fundamental, fundamentalLogged),
        thdPercent: statisticsOf(channel.thdPercent, channel.logged?.thd),
        distortion: statisticsOf(distortion, channel.logged?.thd),
      };
    }),
  };
}
