// What the sheet's interactive part (a client component) receives of an evaluation result: the shown
// channel only, so a page carries one channel's rows instead of the whole result, and each rule's words
// once per channel instead of once per order.
import type { EvaluationContext } from "@/lib/compliance/model";
import type { ChannelCompliance, ComplianceAggregate, ComplianceRow, RowRuleResult, TimeBasis } from "@/lib/compliance/result";
import type { ChannelSummary, ResultHead } from "./result-head";

/** The sheet body as its components read it (unpackSheetBody gives it back from the payload). */
export interface SheetBodyData {
  /** Every evaluated channel (each phase), worst first, for the channel selector. */
  channels: ChannelSummary[];
  /** The shown channel: its band, rows, aggregates, conditions, time rules and power choice. */
  channel: ChannelCompliance;
  context: EvaluationContext;
  timeBasis?: TimeBasis;
}

/** The parts of a rule result that differ from order to order. */
type RuleOwnKey = "measured" | "limit" | "tableLimit" | "percentOfLimit" | "verdict";

/**
 * What rule results of a channel share: the rule (id, label, statistic, multiplier), the unit, the
 * counts and, when it could not be evaluated, why — the same for most orders.
 */
export type RulePart = Omit<RowRuleResult, RuleOwnKey | "source">;

/** A rule result as sent: its own values and the index of its shared part in `ruleParts`. */
export type PackedRuleResult = Pick<RowRuleResult, RuleOwnKey> & { part: number };

type Packed<T extends ComplianceRow | ComplianceAggregate> = Omit<T, "rowRules" | "limitSource"> & { rowRules?: PackedRuleResult[] };

/** What the page hands the client: SheetBodyData with each rule result's shared part sent once. */
export interface SheetBodyPayload extends Omit<SheetBodyData, "channel"> {
  channel: Omit<ChannelCompliance, "rows" | "aggregates"> & { rows: Packed<ComplianceRow>[]; aggregates: Packed<ComplianceAggregate>[] };
  /** The distinct shared parts of the channel's rule results; a rule result names its part by index. */
  ruleParts: RulePart[];
}

/**
 * The data of the sheet's body: the list of channels for the selector (from the result's head) and the
 * shown channel whole but for provenance texts and words the client derives from typed fields. Per-row
 * and per-rule sources stay in the limit-table screens and the JSON export; a rule's statistic is worded
 * from its typed `measures` (its stored words are kept only for results stored before `measures`).
 * Each rule result is split into its own values and a part many orders share (which rule, its words, why
 * it was not evaluated), sent once: about 50 orders × 3–4 rules would otherwise repeat the same labels and
 * reasons some 200 times. unpackSheetBody restores the rows. O(rows of the shown channel × rules).
 *
 * @example sheetBodyData(head, channel).channels.map((c) => c.channel) // ["Ia", "Ib", "Ic"]
 */
export function sheetBodyData(head: ResultHead, channel: ChannelCompliance): SheetBodyPayload {
  const ruleParts: RulePart[] = [];
  const partIndex = new Map<string, number>();
  const packRules = (rules: RowRuleResult[] | undefined): PackedRuleResult[] | undefined =>
    rules?.map(({ source: _source, statistic, measured, limit, tableLimit, percentOfLimit, verdict, ...rest }) => {
      const part: RulePart = rest.measures || statistic === undefined ? rest : { ...rest, statistic };
      const key = JSON.stringify(part);
      let index = partIndex.get(key);
      if (index === undefined) {
        index = ruleParts.push(part) - 1;
        partIndex.set(key, index);
      }
      return { measured, limit, tableLimit, percentOfLimit, verdict, part: index };
    });
  const packRow = <T extends ComplianceRow | ComplianceAggregate>({ limitSource: _limitSource, rowRules, ...row }: T): Packed<T> => {
    const packed = packRules(rowRules);
    return { ...row, ...(packed ? { rowRules: packed } : {}) } as Packed<T>;
  };
  return {
    channels: head.channels,
    channel: {
      ...channel,
      rows: channel.rows.map(packRow),
      aggregates: channel.aggregates.map(packRow),
      ...(channel.timeRules ? { timeRules: channel.timeRules.map(({ source: _source, ...rule }) => rule) } : {}),
    },
    ruleParts,
    context: head.context,
    ...(head.timeBasis ? { timeBasis: head.timeBasis } : {}),
  };
}
