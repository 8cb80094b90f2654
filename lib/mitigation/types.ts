// Shapes of the mitigation what-ifs: the mitigations an engineer picks and the predicted result.
import type { ComplianceResult } from "../compliance/result";
import type { FrontEndFamily, FrontEndParameters } from "../frontends/types";

/** One mitigation. Percentages of reactors are on the load's rated base. */
export type Mitigation =
  | { kind: "reactor"; percent: number }
  | { kind: "dc-choke"; percent: number }
  | { kind: "multi-pulse"; pulses: 12 | 18; imbalancePercent: number }
  | { kind: "passive-filter"; tuningOrder: number; kvar: number; q: number }
  | { kind: "active-filter"; ratingA: number; fromOrder: number; toOrder: number };

/** Supply data a PCC filter needs. */
export interface NetworkData {
  /** Line-to-line voltage at the PCC, V. */
  busVoltageV?: number;
  /** Short-circuit current at the PCC, A. */
  iscA?: number;
  /** X/R of the source impedance (default DEFAULT_X_OVER_R). */
  xOverR?: number;
}

/** The fitted front end a what-if starts from. */
export interface FittedFrontEnd {
  family: FrontEndFamily;
  parameters: FrontEndParameters;
}

export interface PredictedHarmonic {
  order: number;
  /** Predicted r.m.s. current into the supply, A; null where the order was not measured. */
  rms: number | null;
  /** The measured value, A (for the measured → predicted table). */
  measuredRms: number | null;
}

/** Duty of a filter capacitor against IEEE Std 18-2012 limits, each in % of rating. */
export interface CapacitorDuty {
  rmsVoltagePercent: number;
  peakVoltagePercent: number;
  rmsCurrentPercent: number;
  kvarPercent: number;
  limits: { rmsVoltagePercent: number; peakVoltagePercent: number; rmsCurrentPercent: number; kvarPercent: number };
  withinLimits: boolean;
}

/** What a PCC filter did on one channel. */
export interface FilterReport {
  kind: "passive-filter" | "active-filter";
  /** Passive: parallel-resonance order with the source. */
  parallelResonanceOrder?: number;
  capacitorDuty?: CapacitorDuty;
  /** Active: r.m.s. current the filter injects, A, and its share of the rating. */
  ratingUsedA?: number;
  ratingUsedPercent?: number;
}

export interface WhatIfChannel {
  name: string;
  /** The front end the prediction starts from (the diagnosis's best candidate). */
  frontEnd: FittedFrontEnd & { description: string; fitErrorPercent: number };
  fundamentalA: number;
  harmonics: PredictedHarmonic[];
  thdPercent: number;
  /** Null without IL. */
  tddPercent: number | null;
  measuredThdPercent: number;
  measuredTddPercent: number | null;
  filters: FilterReport[];
}

export interface WhatIfResult {
  /** Always true: every number here is a model prediction. */
  prediction: true;
  modelVersion: string;
  mitigations: Mitigation[];
  channels: WhatIfChannel[];
  /** Re-judged against the same limit-set revision and context as the measured sheet (when given). */
  compliance: ComplianceResult | null;
  assumptions: string[];
  warnings: string[];
  caution: string;
}
