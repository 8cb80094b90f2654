// The shapes shared by the window analyzer and its aggregation (window-analyzer.ts, aggregate-windows.ts).
import type { ChannelResult, PhaseLabel, PowerPhase, Quantity, SequenceSet } from "./types";

/** Shape of the windows, fixed for a capture. */
export interface WindowShape {
  /** Cycles per window: 10 at 50 Hz, 12 at 60 Hz. */
  cycles: number;
  /** Points each window is resampled to (a power of two). */
  points: number;
  /** Orders stored per window (≥ 50). */
  orders: number;
  maxOrder: number;
  resolvableOrder: number;
  thdMaxOrder: number;
  /** Half-width of the resampling kernel, in source samples (one for the whole capture). */
  halfWidth: number;
  /** Samples copied before a window's first sample for the interpolator. */
  padding: number;
  /** Samples copied per window (window + both paddings). */
  span: number;
}

export interface AnalyzerChannel {
  name: string;
  quantity: Quantity;
  phase: PhaseLabel | null;
  scale: number;
}

export interface ChannelState extends AnalyzerChannel {
  points: Float64Array;
  spectrum: Float64Array;
  /** Per window × order (0..orders) r.m.s.; order 0 holds the signed DC. */
  orderRms: Float64Array;
  phasorSumRe: Float64Array;
  phasorSumIm: Float64Array;
  /** Sums of squares over windows of group, subgroup, interharmonic group and subgroup per order. */
  groupSq: Float64Array;
  subgroupSq: Float64Array;
  interGroupSq: Float64Array;
  interSubgroupSq: Float64Array;
  windowRms: Float64Array;
  windowThd: Float64Array;
  windowPeak: Float64Array;
  windowRe: Float64Array;
  windowIm: Float64Array;
}

/** What {@link WindowAnalyzer.finish} returns: the channel results, power and sequence sets. */
export interface WindowAggregate {
  channels: ChannelResult[];
  power: { phases: PowerPhase[]; total: { activePowerW: number; apparentPowerVA: number; truePowerFactor: number } | null };
  sequence: SequenceSet[];
}
