// What the sheet's interactive part (a client component) receives of an evaluation result: the shown
// channel only, so a page carries one channel's rows instead of the whole result.
import type { EvaluationContext } from "@/lib/compliance/model";
import type { ChannelCompliance, ComplianceAggregate, ComplianceRow, RowRuleResult, TimeBasis } from "@/lib/compliance/result";
import type { ChannelSummary, ResultHead } from "./result-head";

export interface SheetBodyData {
  /** Every evaluated channel (each phase), worst first, for the channel selector. */
  channels: ChannelSummary[];
  /** The shown channel: its band, rows, aggregates, conditions, time rules and power choice. */
  channel: ChannelCompliance;
  context: EvaluationContext;
  timeBasis?: TimeBasis;
}

// Per-row and per-rule sources stay in the limit-table screens and the JSON export; the sheet does not print them.
// A rule's statistic is worded from its typed `measures` (ruleStatisticText); the stored words are kept only
// for results stored before `measures` existed.
const withoutRuleSources = (rules: RowRuleResult[] | undefined) =>
  rules?.map(({ source: _source, statistic, ...rule }) => (rule.measures || statistic === undefined ? rule : { ...rule, statistic }));
const withoutRowSources = <T extends ComplianceRow | ComplianceAggregate>({ limitSource: _limitSource, ...row }: T): T => {
  const rowRules = withoutRuleSources(row.rowRules);
  return { ...row, ...(rowRules ? { rowRules } : {}) } as T;
};

/**
 * The data of the sheet's body: the list of channels for the selector (from the result's head) and the
 * shown channel whole but for provenance texts and words the client derives from typed fields.
 * O(rows of the shown channel × rules).
 *
 * @example sheetBodyData(head, channel).channels.map((c) => c.channel) // ["Ia", "Ib", "Ic"]
 */
export function sheetBodyData(head: ResultHead, channel: ChannelCompliance): SheetBodyData {
  return {
    channels: head.channels,
    channel: {
      ...channel,
      rows: channel.rows.map(withoutRowSources),
      aggregates: channel.aggregates.map(withoutRowSources),
      ...(channel.timeRules ? { timeRules: channel.timeRules.map(({ source: _source, ...rule }) => rule) } : {}),
    },
    context: head.context,
    ...(head.timeBasis ? { timeBasis: head.timeBasis } : {}),
  };
}
