// One band of a limit set judged on one channel: its order rows, aggregates and conditions.
import { conditionReasonText } from "../reports/result-wording";
import { decideByRules, applyPohcAllowanceToRules, judgeAggregate, judgeOrder } from "./apply-time-rules";
import type { ChannelContext } from "./evaluation-types";
import { interpolateBand } from "./interpolate-band";
import type { Band, EvaluationContext } from "./model";
import { pohcAllowance } from "./pohc-allowance";
import { CAPTURE_MEAN_RULE, type ComplianceAggregate, type ComplianceRow, type ConditionResult, type OverallVerdict } from "./result";
import { expandOrders } from "./row-limits";

export interface BandEvaluation {
  label: string;
  description?: string;
  rows: ComplianceRow[];
  aggregates: ComplianceAggregate[];
  conditions: ConditionResult[];
  verdict: OverallVerdict;
}

/** A band's conditions: confirmed by the engineer in the context (pass), else not evaluated; the words come from the verdict. */
function evaluateConditions(band: Band, context: EvaluationContext): ConditionResult[] {
  const asserted = new Set(context.assertedConditions ?? []);
  return band.conditions.map((condition) => {
    const verdict = asserted.has(condition.id) ? ("pass" as const) : ("not-evaluated" as const);
    return { id: condition.id, text: condition.text, verdict, reason: conditionReasonText({ verdict }) };
  });
}

/** fail if any row or required aggregate fails; incomplete if anything required is not evaluated. */
export function channelVerdict(rows: ComplianceRow[], aggregates: ComplianceAggregate[], conditions: ConditionResult[]): OverallVerdict {
  const required = aggregates.filter((aggregate) => aggregate.role === "requirement");
  if (rows.some((row) => row.verdict === "fail") || required.some((aggregate) => aggregate.verdict === "fail")) return "fail";
  if (
    rows.some((row) => row.verdict === "not-evaluated") ||
    required.some((aggregate) => aggregate.verdict === "not-evaluated") ||
    conditions.some((condition) => condition.verdict === "not-evaluated")
  ) {
    return "incomplete";
  }
  return "pass";
}

/** The POHC allowance on rows decided by their capture mean (time rules had it applied per rule). */
function applyPohcAllowanceToCaptureMean(rows: ComplianceRow[], aggregates: ComplianceAggregate[], ctx: ChannelContext): ComplianceRow[] {
  const allowance = ctx.content.rules.pohcAllowance;
  if (!allowance) return rows;
  return rows.map((row) => {
    const byTimeRule = row.decidedBy !== undefined && row.decidedBy !== CAPTURE_MEAN_RULE;
    if (byTimeRule || row.measured === null || row.limit === null) return row;
    const decision = pohcAllowance({ order: row.order, measured: row.measured, tableLimit: row.limit, verdict: row.verdict, othersNotPassing: [] }, aggregates, allowance);
    return decision ? { ...row, verdict: decision.verdict, reason: decision.reason } : row;
  });
}

/**
 * Judge one band (interpolated first where the set interpolates between Rsce rows) on a
 * channel: each order and aggregate by its capture mean and time rules, the POHC allowance,
 * the band's conditions and the band's verdict. O(orders × rules × values).
 *
 * @example
 * evaluateBand(band, ctx).verdict // "fail"
 */
export function evaluateBand(band: Band, ctx: ChannelContext): BandEvaluation {
  const interpolated = interpolateBand(ctx.content, band, ctx.context);
  const used = interpolated?.band ?? band;
  if (used.exempt) {
    return { label: used.label, description: "no limits apply in this band", rows: [], aggregates: [], conditions: [], verdict: "pass" };
  }
  const entries = used.orderRows.flatMap((row) => expandOrders(row).map((h) => ({ h, row })));
  entries.sort((a, b) => a.h - b.h);
  const aggregates = used.aggregates.map((aggregate) => decideByRules(judgeAggregate(aggregate, used, ctx), ctx));
  const orders = entries.map(({ h, row }) => judgeOrder(row, h, ctx));
  applyPohcAllowanceToRules(orders, aggregates, ctx);
  const rows = applyPohcAllowanceToCaptureMean(
    orders.map((judged) => decideByRules(judged, ctx)),
    aggregates,
    ctx,
  );
  const conditions = evaluateConditions(used, ctx.context);
  return {
    label: used.label,
    description: interpolated?.description,
    rows,
    aggregates,
    conditions,
    verdict: channelVerdict(rows, aggregates, conditions),
  };
}
