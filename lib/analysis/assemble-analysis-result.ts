// The one place an analysis result is put together, for the in-memory and the streaming paths.
import type { WindowPlan } from "./plan-windows";
import type { AnalysisResult } from "./types";
import type { WindowAggregate } from "./window-analyzer";

/** What both paths know once their windows are analysed. */
export interface AnalysisParts {
  plan: WindowPlan;
  aggregate: WindowAggregate;
  /** Windows analysed. */
  windowCount: number;
  sampleIntervalS: number;
  /** Samples in the record × the interval, s. */
  durationS: number;
  warnings: string[];
  sampleIntervalSource?: AnalysisResult["sampleIntervalSource"];
}

/**
 * Puts the window plan and the aggregated windows into the design's result shape (sequence
 * components only when a three-phase set exists; the interval's source when known).
 *
 * Complexity O(1) (the arrays are passed on, not copied).
 *
 * @example
 * const result = assembleAnalysisResult({ plan, aggregate, windowCount: 50, sampleIntervalS: 1 / 6400, durationS: 10, warnings: [] });
 */
export function assembleAnalysisResult(parts: AnalysisParts): AnalysisResult {
  const { plan, aggregate } = parts;
  const result: AnalysisResult = {
    fundamentalHz: plan.fundamentalHz,
    nominalHz: plan.nominalHz,
    sampleIntervalS: parts.sampleIntervalS,
    durationS: parts.durationS,
    window: { cycles: plan.shape.cycles, points: plan.shape.points, count: parts.windowCount },
    maxResolvableOrder: plan.shape.resolvableOrder,
    channels: aggregate.channels,
    power: aggregate.power,
    warnings: parts.warnings,
  };
  if (aggregate.sequence.length > 0) result.sequence = aggregate.sequence;
  if (parts.sampleIntervalSource) result.sampleIntervalSource = parts.sampleIntervalSource;
  return result;
}
