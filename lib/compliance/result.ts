// Shapes of an evaluation result (the `compliance` part of the analysis JSON). Plain data,
// produced only by evaluateCompliance; the database stores it alongside the revision id.
import type { AggregateName, Basis, EvaluationContext, TimeRule } from "./model";

/** Per-order verdict. `below-threshold`: disregarded by a threshold rule (counts as compliant). */
export type RowVerdict = "pass" | "fail" | "below-threshold" | "not-evaluated";
export type AggregateVerdict = "pass" | "fail" | "not-evaluated";
/**
 * Overall verdict. `fail`: something measured exceeds its limit. `pass`: every required row,
 * aggregate and condition was evaluated and none failed. `incomplete`: nothing failed, but
 * something required could not be evaluated (missing context, above Nyquist, unverifiable
 * condition) — never reported as a pass.
 */
export type OverallVerdict = "pass" | "fail" | "incomplete";

/** An input the user gives in the evaluation context (or a measured value standing in for it). */
export type ContextInput = "h" | "ratedPowerW" | "lambda" | "ilA" | "irefA" | "nominalVoltageV" | "fundamental" | "ampere-order-limits";

/**
 * Why a row, aggregate or rule was not evaluated, as a code with its numbers. The words for
 * people are generated from it in one place (lib/reports/result-wording.ts).
 */
export type NotEvaluatedCause =
  | { code: "missing-input"; input: ContextInput }
  | { code: "above-nyquist"; maxResolvableOrder: number }
  | { code: "not-analysed"; analysedUpTo: number }
  | { code: "not-in-record"; record: "analysis" | "interval-log" }
  | { code: "partial-sum"; unavailableOrders: number[]; record: "analysis" | "interval-log" }
  | { code: "no-band"; detail: string }
  | { code: "no-order-series" }
  | { code: "no-logged-rows" }
  | { code: "record-too-short"; minimumS: number; durationS: number }
  | { code: "no-complete-interval"; intervalS: TimeRule["intervalS"]; durationS: number; clockAligned: boolean }
  | { code: "needs-other-values"; intervalS: TimeRule["intervalS"]; loggedValueS: number }
  | { code: "no-limit" }
  | { code: "no-applicable-row" }
  | { code: "allowance-unchecked"; aggregate: string }
  | { code: "non-finite"; quantity: "measured" | "limit" };

/** What a rule takes its statistic of: the kind, over which values, accumulated how. */
export interface RuleStatistic {
  /** `capture-mean`: the r.m.s. mean over the capture's windows (the stand-in comparison). */
  kind: "mean" | "max" | "percentile" | "capture-mean";
  /** Nearest-rank percentile, % (percentile rules only). */
  percentile?: number;
  /** Values the statistic is taken over: 0 window values, 1.5 smoothed, 3 s, 600 s (time rules only). */
  intervalS?: TimeRule["intervalS"];
  /** Accumulation period, s; absent: the whole record. */
  accumulationS?: number;
  /** Windows the capture mean was taken over (capture-mean only). */
  windowCount?: number;
}

/** How a rule's periods covered the record (rules with an accumulation period). */
export interface RuleAccumulation {
  periodS: number;
  periodCount: number;
  /** Record length the rule's values cover, s; less than `periodS`: evaluated over a partial period. */
  availableS: number;
  valueCount: number;
}

/**
 * Id of the capture-mean comparison among a row's rule results: the capture's r.m.s. mean against
 * 1.0 × the limit. Stored in results under this name, so it stays "snapshot".
 */
export const CAPTURE_MEAN_RULE = "snapshot";

/**
 * One rule's judgement of one order or aggregate: a time rule of the revision
 * (`rules.timeRules`, e.g. "daily-p99-very-short") or CAPTURE_MEAN_RULE — the capture's r.m.s. mean
 * compared with 1.0 × the limit, which stands in when time rules cannot all be evaluated.
 */
export interface RowRuleResult {
  /** Time-rule id, or CAPTURE_MEAN_RULE. */
  rule: string;
  label: string;
  /** What was measured, in words (generated from `measures`; results stored before it existed carry only this). */
  statistic?: string;
  /** What was measured, as data (absent in results stored before it existed). */
  measures?: RuleStatistic;
  /** The statistic, in `unit`. */
  measured: number | null;
  /** Limit applied = table limit × multiplier (× an allowance factor where one applied). */
  limit: number | null;
  tableLimit: number | null;
  multiplier: number;
  unit: string;
  percentOfLimit: number | null;
  verdict: "pass" | "fail" | "not-evaluated";
  reason?: string;
  source?: string;
  /** Values the statistic was taken over, and the accumulation periods (time rules only). */
  valueCount?: number;
  periodCount?: number;
  /** Accumulation periods used, when the rule has one. */
  accumulation?: RuleAccumulation;
  /** Why not evaluated (absent when evaluated, and in results stored before it existed). */
  cause?: NotEvaluatedCause;
}

/** How one time rule fared on one channel: applied or not, and on what data. */
export interface TimeRuleSummary {
  rule: string;
  label: string;
  multiplier: number;
  /** `applied`: evaluated for at least one row or aggregate; `not-evaluated`: for none. */
  status: "applied" | "not-evaluated";
  /** Why not evaluated (e.g. the minimum record length), or notes on a partial period. */
  reason?: string;
  /** Values the statistic was taken over (per order), and the accumulation periods used. */
  valueCount: number;
  periodCount: number;
  /** Rows and aggregates this rule failed. */
  failures: number;
  source?: string;
  /** What the rule measures (absent in results stored before it existed). */
  measures?: RuleStatistic;
  /** Why not evaluated, as a code. */
  cause?: NotEvaluatedCause;
  /** Accumulation periods used where the record is shorter than one period or spans several. */
  accumulation?: RuleAccumulation;
}

/** The time base the time rules were evaluated on. */
export interface TimeBasis {
  source: "windows" | "interval-log" | "none";
  /** Duration of one value, s (≈ 0.2 for 10/12-cycle windows; 600 for a 10-minute log). */
  valueS: number | null;
  valueCount: number;
  /** Record length, s (first value start to last value end). */
  durationS: number;
  /** Start of the record, ms since the epoch, when known (10-minute values then align to the clock). */
  startMs: number | null;
  /** Whether rules that cannot be evaluated fall back to the capture-mean comparison (stored name). */
  snapshotFallback: boolean;
  /** `all`: every time rule was applied; `partial`: some were not; `none`: none (capture mean only). */
  coverage: "all" | "partial" | "none";
}

/** A measured value beside its limit, as rows and aggregates carry it. `measured`, `limit` and `margin` are in `unit`. */
export interface JudgedValue {
  measured: number | null;
  limit: number | null;
  /** Unit of `measured`, `limit` and `margin`; on rows "A" for A and mA/W limits (mA/W × P is converted to amperes), else the basis (e.g. "%IL"). */
  unit: string;
  basis: Basis;
  /** measured / limit × 100. */
  percentOfLimit: number | null;
  /** limit − measured (positive = headroom). */
  margin: number | null;
}

/** One harmonic order. `measured`, `limit` and `margin` are in `unit`. */
export interface ComplianceRow extends JudgedValue {
  order: number;
  verdict: RowVerdict;
  reason?: string;
  /** Why not evaluated, as a code (absent in results stored before it existed). */
  cause?: NotEvaluatedCause;
  /** The threshold that disregarded this order (below-threshold rows). */
  threshold?: ThresholdApplied;
  limitSource?: string;
  /**
   * Each applicable rule's judgement when the revision has time rules. When time rules decided,
   * `measured`, `limit`, `percentOfLimit` and `margin` above are those of the deciding rule
   * (its statistic against table limit × multiplier).
   */
  rowRules?: RowRuleResult[];
  /** Id of the rule that decided the verdict ("snapshot" for the capture-mean comparison). */
  decidedBy?: string;
}

/** IEC 61000-3-2 threshold as applied to a row: max(percent × input current, minimum). */
export interface ThresholdApplied {
  thresholdA: number;
  percentOfInputCurrent: number;
  inputCurrentA: number;
  minimumA: number;
  source: string;
}

export interface ComplianceAggregate extends JudgedValue {
  name: AggregateName;
  verdict: AggregateVerdict;
  /** `allowance-condition` aggregates are reported but do not count towards the verdict. */
  role: "requirement" | "allowance-condition";
  reason?: string;
  cause?: NotEvaluatedCause;
  limitSource?: string;
  rowRules?: RowRuleResult[];
  decidedBy?: string;
}

/** A quantity of the evaluation context that chooses a limit set's band (Isc/IL from Isc and IL). */
export type BandCriterion = "iscOverIl" | "busVoltageV" | "rsce" | "ratedPowerW" | "phaseConfig";

export interface ConditionResult {
  id: string;
  text: string;
  verdict: "pass" | "not-evaluated";
  reason: string;
}

export interface BandChoice {
  /** Label of the band used; null when none could be chosen. */
  label: string | null;
  reason: string;
  /** Alternative options evaluated (IEC 61000-3-2 Class C 5–25 W, IEC 61000-3-12 Tables 3/4). */
  options?: Array<{ label: string; verdict: OverallVerdict }>;
}

/**
 * Which power chose and scaled the limits (IEC 61000-3-2 Class C/D): the declared (rated) power
 * within ±10 % of the measured active power, else the measured power.
 */
export interface PowerChoice {
  /** The manufacturer's declared (rated) power from the context, W. */
  declaredW: number | null;
  /** Measured active power, W (null when no voltage was recorded). */
  measuredW: number | null;
  /** The power the limits used, W. */
  usedW: number | null;
  rule: "declared-within-tolerance" | "measured-declared-outside-tolerance" | "declared-not-measured" | "measured-no-declaration" | "none";
  /** (declared − measured) / measured × 100, when both are known. */
  deviationPercent?: number;
  tolerancePercent: number;
}

export interface ChannelCompliance {
  channel: string;
  phase: string | null;
  band: BandChoice;
  rows: ComplianceRow[];
  aggregates: ComplianceAggregate[];
  conditions: ConditionResult[];
  verdict: OverallVerdict;
  /** Values derived for this channel when the context did not give them (Iref, λ). */
  derived: { irefA?: number; lambda?: number; notes: string[] };
  /** Per time rule of the revision: applied or not and why (absent when the revision has none). */
  timeRules?: TimeRuleSummary[];
  /** The power that chose and scaled the limits (sets whose limits depend on rated power only). */
  power?: PowerChoice;
}

export interface ComplianceResult {
  limitSet: { key: string; name: string; standard: string; edition: string; scope: string };
  revision: { id: string | number; number: number };
  context: EvaluationContext;
  /** The worst channel (whose band, rows and aggregates are shown at the top level). */
  channel: string | null;
  band: BandChoice;
  rows: ComplianceRow[];
  aggregates: ComplianceAggregate[];
  conditions: ConditionResult[];
  verdict: OverallVerdict;
  /** Every evaluated channel (each phase), worst first. */
  channels: ChannelCompliance[];
  /** Rules applied and caveats (comparison rule, threshold, time rules not applied, …). */
  notes: string[];
  /** The worst channel's time-rule summary (absent when the revision has no time rules). */
  timeRules?: TimeRuleSummary[];
  /** What the time rules were evaluated on (absent when the revision has no time rules). */
  timeBasis?: TimeBasis;
  /** The worst channel's power choice (sets whose limits depend on rated power only). */
  power?: PowerChoice;
}
