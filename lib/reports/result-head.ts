// A result split for the sheet page: the part shown above and beside the order tables (small), and each
// channel's rows on their own, so a page reads and sends one channel instead of the whole result.
import type { ChannelCompliance, ComplianceResult, OverallVerdict } from "@/lib/compliance/result";
import { channelBlocks } from "./sheet-report";

/** A channel as the selector lists it. */
export interface ChannelSummary {
  channel: string;
  phase: string | null;
  verdict: OverallVerdict;
}

/** A result without its per-order rows and aggregates: verdict, limit set, context, band, notes, conditions, time basis. */
export interface ResultHead extends Omit<ComplianceResult, "rows" | "aggregates" | "channels"> {
  /** Every channel (each phase), worst first, without rows. */
  channels: ChannelSummary[];
  /** Orders over their limit on the worst channel (the top level of the result). */
  failingOrders: number[];
}

/**
 * A result as the sheet page stores it beside the whole one: the head, and the channel blocks (every
 * evaluated channel, worst first, or the top level for results that list none) whole. O(rows).
 *
 * @example splitResult(result).channels[0].channel === result.channels[0].channel // true
 */
export function splitResult(result: ComplianceResult): { head: ResultHead; channels: ChannelCompliance[] } {
  const { rows, aggregates: _aggregates, channels: _channels, ...rest } = result;
  const channels = channelBlocks(result);
  return {
    head: {
      ...rest,
      channels: channels.map((c) => ({ channel: c.channel, phase: c.phase, verdict: c.verdict })),
      failingOrders: rows.filter((r) => r.verdict === "fail").map((r) => r.order),
    },
    channels,
  };
}
