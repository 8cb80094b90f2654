// Shapes of an evaluation result (the `compliance` part of the analysis JSON). Plain data,
// produced only by evaluateCompliance; the database stores it alongside the revision id.
import type { AggregateName, Basis, EvaluationContext } from "./model";

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

/** One harmonic order. `measured`, `limit` and `margin` are in `unit`. */
export interface ComplianceRow {
  order: number;
  measured: number | null;
  limit: number | null;
  /** "A" for A and mA/W rows (mA/W × P is converted to amperes), else the basis (e.g. "%IL"). */
  unit: string;
  basis: Basis;
  percentOfLimit: number | null;
  /** limit − measured (positive = headroom). */
  margin: number | null;
  verdict: RowVerdict;
  reason?: string;
  limitSource?: string;
}

export interface ComplianceAggregate {
  name: AggregateName;
  measured: number | null;
  limit: number | null;
  unit: string;
  basis: Basis;
  percentOfLimit: number | null;
  margin: number | null;
  verdict: AggregateVerdict;
  /** `allowance-condition` aggregates are reported but do not count towards the verdict. */
  role: "requirement" | "allowance-condition";
  reason?: string;
  limitSource?: string;
}

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
}
