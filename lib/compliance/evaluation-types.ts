// Types shared by the evaluator's files: its input, and the per-channel facts every row and
// aggregate is computed from. The result shapes are in result.ts.
import type { AnalysisResult, ChannelResult, HarmonicValue } from "../analysis/types";
import type { TimeSeriesTiming } from "./derive-rule-values";
import type { TimeRuleOutcome } from "./evaluate-time-rule";
import type { EvaluationContext, LimitSetRevisionContent, LimitSetRevisionContentInput, TimeRule } from "./model";
import type { ContextInput, NotEvaluatedCause, TimeBasis } from "./result";

export interface EvaluateComplianceInput {
  analysis: AnalysisResult;
  /** Evaluate only this channel (its header name); default: every channel of the set's quantity. */
  channel?: string;
  limitSet: {
    key: string;
    name: string;
    revision: { id: string | number; number: number };
    content: LimitSetRevisionContent | LimitSetRevisionContentInput;
  };
  context: EvaluationContext;
  /** Start of the first window, ms since the epoch: 10-minute values then align to the clock (else to the record start). */
  recordStartMs?: number;
  /** Time series that replace the analysis's window series — interval logs (see evaluateIntervalLog). */
  timeSeries?: TimeSeriesInput;
}

/** Per-channel value series on one time base, e.g. the rows of an interval log. */
export interface TimeSeriesInput {
  source: "interval-log";
  /** Duration of one value, s (e.g. 600 for 10-minute values). */
  valueS: number;
  /** Start of each value, s since the epoch. */
  startsS: Float64Array;
  /** Keyed by channel name; values in A or V per order (order 1 = fundamental), THD in %. */
  channels: Record<string, { orders: Map<number, Float64Array>; thdPercent?: Float64Array }>;
}

/** Which record the measured values come from; names it in "not in …" reasons. */
export type RecordKind = "analysis" | "interval-log";

/**
 * A value obtained from the limit set and the context (a limit, or a measured value in a
 * basis): the value and how it was obtained, or which input was missing.
 */
export type Derived<T> = { ok: true; value: T; derivation?: string } | { ok: false; missing: ContextInput };

/** The time-rule facts of one channel: its rules, time base and per-order series. */
export interface ChannelTimeSeries {
  rules: TimeRule[];
  /** Null when there is no series (`unavailable` says why). */
  timing: TimeSeriesTiming | null;
  unavailable?: NotEvaluatedCause;
  /** Analysis captures: the capture-mean comparison stands in for rules that cannot be evaluated. */
  captureMeanFallback: boolean;
  orderSeries: (h: number) => Float64Array | null;
  fundamental: Float64Array | null;
  thdPercent: Float64Array | null;
  basis: TimeBasis;
}

/** Per-channel facts the rows and aggregates are computed from. */
export interface ChannelContext {
  channel: ChannelResult;
  harmonics: Map<number, HarmonicValue>;
  analysedUpTo: number;
  maxResolvableOrder: number;
  content: LimitSetRevisionContent;
  context: EvaluationContext;
  lambda?: number;
  irefA?: number;
  notes: string[];
  /** Null when the revision has no time rules. */
  time: ChannelTimeSeries | null;
  record: RecordKind;
  windowCount: number;
}

/** One order's or aggregate's capture-mean result and each time rule's result (null: no rule applies). */
export interface JudgedWithRules<T> {
  captureMean: T;
  ruleResults: TimeRuleOutcome[] | null;
  /** What the capture mean's reason says of the limit alone, for a verdict a time rule decides (aggregates; null: nothing); absent: its whole reason. */
  limitRemark?: string | null;
}

/** How a record is named in reasons. */
export function recordName(record: RecordKind): string {
  return record === "interval-log" ? "the interval log" : "the analysis";
}
