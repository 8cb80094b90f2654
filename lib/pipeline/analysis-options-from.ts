// The mapping form's choices (and the evaluation context's IL/Iref) as engine options.
import type { AnalysisOptions } from "@/lib/analysis/types";
import type { EvaluationContext } from "@/lib/compliance/model";
import type { CaptureMapping } from "@/lib/validations/capture";

/** Translates the mapping form's choices into engine options (per-window order series always on: the time rules need them). */
export function analysisOptionsFrom(mapping: CaptureMapping, context: EvaluationContext): AnalysisOptions {
  const channels: NonNullable<AnalysisOptions["channels"]> = {};
  for (const [name, m] of Object.entries(mapping.channels)) {
    if (m.ignore) {
      channels[name] = { ignore: true };
      continue;
    }
    channels[name] = {
      ...(m.quantity ? { quantity: m.quantity } : {}),
      ...(m.scale !== undefined ? { scale: m.scale } : {}),
      ...(m.phase !== undefined ? { phase: m.phase } : {}),
      ...(m.time ? { time: true } : {}),
    };
  }
  return {
    channels,
    ...(mapping.sampleIntervalS !== undefined ? { sampleIntervalS: mapping.sampleIntervalS } : {}),
    ...(mapping.frequencyHz !== undefined ? { frequencyHz: mapping.frequencyHz } : {}),
    thdMaxOrder: mapping.thdMaxOrder ?? 50,
    ...(context.ilA !== undefined ? { ilA: context.ilA } : {}),
    ...(context.irefA !== undefined ? { irefA: context.irefA } : {}),
    includeOrderSeries: true,
  };
}
