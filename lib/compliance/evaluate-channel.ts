// One channel judged against a revision: band choice, each candidate band evaluated, the
// option shown, and the channel's time-rule summary.
import type { AnalysisResult, ChannelResult } from "../analysis/types";
import { unchosenRows } from "./capture-mean";
import { channelContext } from "./channel-context";
import { choosePower, measuredActivePowerW, usesRatedPower } from "./declared-power";
import { evaluateBand, type BandEvaluation } from "./evaluate-band";
import { ruleMeasures } from "./evaluate-time-rule";
import type { EvaluateComplianceInput } from "./evaluation-types";
import type { EvaluationContext, LimitSetRevisionContent } from "./model";
import type { BandChoice, ChannelCompliance, TimeBasis, TimeRuleSummary } from "./result";
import { selectBand } from "./select-band";
import { summarizeTimeRules } from "./time-rule-summary";

/**
 * Judge one channel: choose the band from the context, evaluate it (every option where the set
 * offers alternatives: the first passing wins, else an incomplete one, else the first), and
 * summarise the time rules. Returns the channel's result and the time base it used.
 * O(bands × orders × rules × values).
 *
 * @example
 * evaluateChannel(analysis, analysis.channels[0], content, context, input).verdict // "pass"
 */
export function evaluateChannel(
  analysis: AnalysisResult,
  channel: ChannelResult,
  content: LimitSetRevisionContent,
  context: EvaluationContext,
  input: EvaluateComplianceInput,
): ChannelCompliance & { timeBasis?: TimeBasis } {
  // Rated power chooses and scales Class C/D limits: the declared value only within ±10 % of the measured.
  const power = usesRatedPower(content) ? choosePower(context.ratedPowerW, measuredActivePowerW(analysis, channel.name)) : undefined;
  const judged: EvaluationContext = power ? { ...context, ratedPowerW: power.usedW ?? undefined } : context;
  const ctx = channelContext(analysis, channel, content, judged, input);
  const timeBasis = ctx.time?.basis;
  const derived = { irefA: ctx.irefA, lambda: ctx.lambda, notes: ctx.notes };
  const selection = selectBand(content, judged);
  const common = { channel: channel.name, phase: channel.phase, derived, ...(power ? { power } : {}) };
  const unchosenTimeRules = (reason: string): { timeRules?: TimeRuleSummary[]; timeBasis?: TimeBasis } =>
    ctx.time
      ? {
          timeRules: ctx.time.rules.map((rule) => ({
            rule: rule.id,
            label: rule.label,
            multiplier: rule.multiplier,
            status: "not-evaluated" as const,
            reason,
            cause: { code: "no-band" as const, detail: reason },
            measures: ruleMeasures(rule),
            valueCount: 0,
            periodCount: 0,
            failures: 0,
            ...(rule.source ? { source: rule.source } : {}),
          })),
          timeBasis,
        }
      : {};
  if (selection.status === "no-band") {
    return { ...common, band: { label: null, reason: selection.reason }, rows: [], aggregates: [], conditions: [], verdict: "incomplete", ...unchosenTimeRules(selection.reason) };
  }
  if (selection.status === "missing-context") {
    const { rows, aggregates } = unchosenRows(selection.candidates, { code: "no-band", detail: selection.reason }, ctx);
    return { ...common, band: { label: null, reason: selection.reason }, rows, aggregates, conditions: [], verdict: "incomplete", ...unchosenTimeRules(selection.reason) };
  }
  const evaluations = selection.bands.map((band) => evaluateBand(band, ctx));
  // Alternatives: the first passing option wins; otherwise an incomplete one; all failing → fail.
  const chosen =
    evaluations.find((evaluation) => evaluation.verdict === "pass") ??
    evaluations.find((evaluation) => evaluation.verdict === "incomplete") ??
    (evaluations[0] as BandEvaluation);
  const reasonParts = [selection.reason, chosen.description];
  if (evaluations.length > 1) {
    reasonParts.push(`options: ${evaluations.map((evaluation) => `${evaluation.label} → ${evaluation.verdict}`).join("; ")}; shown: ${chosen.label}`);
  }
  if (chosen.rows.length === 0 && chosen.aggregates.length === 0 && chosen.verdict === "pass") reasonParts.push("no limits apply in this band");
  const band: BandChoice = {
    label: chosen.label,
    reason: reasonParts.filter(Boolean).join(" — "),
    ...(evaluations.length > 1 ? { options: evaluations.map((evaluation) => ({ label: evaluation.label, verdict: evaluation.verdict })) } : {}),
  };
  const timeRules = summarizeTimeRules(chosen.rows, chosen.aggregates, ctx);
  const timeExtras: { timeRules?: TimeRuleSummary[]; timeBasis?: TimeBasis } = {};
  if (timeRules && timeBasis) {
    const applied = timeRules.filter((rule) => rule.status === "applied").length;
    timeExtras.timeRules = timeRules;
    timeExtras.timeBasis = { ...timeBasis, coverage: applied === 0 ? "none" : applied === timeRules.length ? "all" : "partial" };
  }
  return { ...common, band, rows: chosen.rows, aggregates: chosen.aggregates, conditions: chosen.conditions, verdict: chosen.verdict, ...timeExtras };
}
