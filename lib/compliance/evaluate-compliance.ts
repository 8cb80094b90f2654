// The pure compliance evaluator: analysis result + limit-set revision + context → per-order
// verdicts, aggregates and an overall verdict, with a reason wherever something is not a plain
// pass. Missing information never turns into a pass. The work is split by seam:
//   row-limits.ts (limits, basis conversion) · capture-mean.ts (capture-mean rows, aggregates)
//   apply-time-rules.ts (time rules, deciding rule) · pohc-allowance.ts · evaluate-band.ts
//   channel-context.ts (per-channel set-up) · evaluate-channel.ts · time-rule-summary.ts
import { evaluateChannel } from "./evaluate-channel";
import type { EvaluateComplianceInput } from "./evaluation-types";
import { EvaluationContextSchema, LimitSetRevisionContentSchema } from "./model";
import type { ChannelCompliance, ComplianceAggregate, ComplianceResult, ComplianceRow, OverallVerdict } from "./result";
import { timeRulesNote } from "./time-rule-summary";

export type { EvaluateComplianceInput, TimeSeriesInput } from "./evaluation-types";

const VERDICT_RANK: Record<OverallVerdict, number> = { pass: 0, incomplete: 1, fail: 2 };

function worstPercent(rows: ComplianceRow[], aggregates: ComplianceAggregate[]): number {
  const values = [...rows.map((row) => row.percentOfLimit), ...aggregates.map((aggregate) => aggregate.percentOfLimit)];
  return Math.max(-Infinity, ...values.filter((value): value is number => value !== null));
}

/**
 * Judge an analysis against a limit-set revision: per-order rows, aggregates and a verdict for
 * every channel of the set's quantity (each phase), the worst channel shown at the top level.
 *
 * Measured values are expressed in each row's basis (A; % of I1, IL, Iref or Vnom; mA/W rows
 * compare amperes with mA/W × P capped by the absolute maximum). A value equal to its limit
 * passes when the set's `rules.comparison.passAtLimit` says so (every seed set: "≤ limit").
 * Missing context, orders above Nyquist and unverifiable conditions give `not-evaluated`
 * rows and an `incomplete` verdict, never a pass. Throws for an unknown `channel` or one whose
 * quantity does not match the set. O(channels × orders × rows).
 *
 * @example
 * const result = evaluateCompliance({
 *   analysis,
 *   limitSet: { key: "iec-61000-3-2-class-a", name: "IEC 61000-3-2 Class A", revision: { id: 1, number: 1 }, content },
 *   context: {},
 * });
 * result.rows.find((row) => row.order === 3) // { order: 3, measured: 2.5, limit: 2.3, unit: "A", verdict: "fail", … }
 */
export function evaluateCompliance(input: EvaluateComplianceInput): ComplianceResult {
  const content = LimitSetRevisionContentSchema.parse(input.limitSet.content);
  const context = EvaluationContextSchema.parse(input.context);
  const { analysis } = input;

  let channels = analysis.channels.filter((channel) => channel.quantity === content.quantity);
  if (input.channel !== undefined) {
    const named = analysis.channels.find((channel) => channel.name === input.channel);
    if (!named) {
      throw new Error(`channel "${input.channel}" not found; channels: ${analysis.channels.map((channel) => channel.name).join(", ")}`);
    }
    if (named.quantity !== content.quantity) {
      throw new Error(`channel "${input.channel}" is a ${named.quantity} channel but ${content.key} limits ${content.quantity}`);
    }
    channels = [named];
  }

  const notes: string[] = [];
  const { comparison, threshold, timeRules } = content.rules;
  // Sources and their provenance stay in the limit set (limit-table screens, JSON export); the sheet's notes say the rule in plain words.
  notes.push(comparison.passAtLimit ? "A value exactly at its limit passes (measured ≤ limit)." : "A value exactly at its limit fails (measured < limit passes).");
  // The limit set's interpretation choices, once per sheet (not per channel or row).
  notes.push(...(content.notes ?? []));
  if (threshold) {
    notes.push(`Currents below ${threshold.percentOfInputCurrent} % of the input current or below ${threshold.minimumA * 1000} mA, whichever is greater, are disregarded.`);
  }
  if (!timeRules || timeRules.length === 0) {
    const windows = analysis.window.count;
    notes.push(
      `Measured values are each order's r.m.s. mean over the capture's ${windows} window${windows === 1 ? "" : "s"}; this revision has no time rules (1.5 s smoothing, 150 % excursions, percentiles).`,
    );
  }

  const evaluated = channels.map((channel) => evaluateChannel(analysis, channel, content, context, input));
  const timeBasis = evaluated[0]?.timeBasis;
  const results: ChannelCompliance[] = evaluated.map(({ timeBasis: _basis, ...channel }) => channel);
  if (timeRules && timeRules.length > 0 && timeBasis) notes.push(...timeRulesNote(timeRules, timeBasis, evaluated[0]?.timeRules));
  results.sort(
    (a, b) =>
      VERDICT_RANK[b.verdict] - VERDICT_RANK[a.verdict] || worstPercent(b.rows, b.aggregates) - worstPercent(a.rows, a.aggregates),
  );
  const worst = results[0];
  const limitSet = {
    key: input.limitSet.key,
    name: input.limitSet.name,
    standard: content.standard,
    edition: content.edition,
    scope: content.scope,
  };
  const timeFields = timeBasis ? { timeRules: worst?.timeRules, timeBasis } : {};
  const powerField = worst?.power ? { power: worst.power } : {};
  if (!worst) {
    return {
      limitSet,
      revision: input.limitSet.revision,
      context,
      channel: null,
      band: { label: null, reason: `the analysis has no ${content.quantity} channel to evaluate` },
      rows: [],
      aggregates: [],
      conditions: [],
      verdict: "incomplete",
      channels: [],
      notes,
    };
  }
  return {
    limitSet,
    revision: input.limitSet.revision,
    context,
    channel: worst.channel,
    band: worst.band,
    rows: worst.rows,
    aggregates: worst.aggregates,
    conditions: worst.conditions,
    verdict: worst.verdict,
    channels: results,
    notes,
    ...timeFields,
    ...powerField,
  };
}
