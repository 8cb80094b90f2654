// The slim part of an analysis that the sheet, the PDF and the CSV read: written beside the analysis when it
// is stored, so a sheet never reads (or makes PostgreSQL walk) the per-order and per-window arrays.
import type { AnalysisResult, ChannelResult, SequenceSet } from "@/lib/analysis/types";
import type { HeadlineSource } from "./headline-numbers";

/** A channel without its per-order, per-group and per-window arrays. */
export type ChannelSummary = Omit<ChannelResult, "harmonics" | "series" | "harmonicSeries" | "groups">;

/** What the sheet needs of an analysis: the headline numbers' source and the sample interval of the set-up. */
export type AnalysisSummary = HeadlineSource & {
  sampleIntervalS: number;
  channels: ChannelSummary[];
  sequence: Array<Omit<SequenceSet, "orders">>;
};

/**
 * An analysis result without its bulky arrays: the fundamental frequency, sample interval, power, each
 * three-phase set's sequence values without the per-order ones, and each channel's scalars (r.m.s., THD,
 * crest factor, K-factor, …) without harmonics, groups and window series, and an interval log's statistics. The same projection is built in
 * SQL for analyses stored before the summary was (db/queries/captures.ts, migration 0008). O(channels).
 *
 * @example analysisSummary(result).channels[0].thdPercent // 31.2 — and no `harmonics` key
 */
export function analysisSummary(result: AnalysisResult): AnalysisSummary {
  return {
    fundamentalHz: result.fundamentalHz,
    sampleIntervalS: result.sampleIntervalS,
    power: result.power,
    sequence: (result.sequence ?? []).map(({ orders: _orders, ...set }) => set),
    channels: result.channels.map(({ harmonics: _h, series: _s, harmonicSeries: _hs, groups: _g, ...channel }) => channel),
    ...(result.intervalLog ? { intervalLog: result.intervalLog } : {}),
  };
}
