// The whole job of one capture, as pure functions: CSV text + mapping → analysis; analysis +
// limit-set revision + context → evaluation. The route handler, the demo seed and the tests call these.
import { analyzeImported } from "@/lib/analysis/analyze-csv";
import { importCsvText } from "@/lib/analysis/import-csv";
import type { AnalysisOptions, AnalysisResult } from "@/lib/analysis/types";
import { evaluateCompliance } from "@/lib/compliance/evaluate-compliance";
import type { EvaluationContext, LimitSetRevisionContent } from "@/lib/compliance/model";
import type { ComplianceResult } from "@/lib/compliance/result";
import type { CaptureMapping } from "@/lib/validations/capture";

export interface Waveform {
  timeS: number[];
  channels: { name: string; unit: string; values: number[] }[];
}

/** Translates the mapping form's choices into engine options. */
export function analysisOptionsFrom(mapping: CaptureMapping, context: EvaluationContext): AnalysisOptions {
  const channels: NonNullable<AnalysisOptions["channels"]> = {};
  for (const [name, m] of Object.entries(mapping.channels)) {
    if (m.ignore) continue;
    channels[name] = {
      ...(m.quantity ? { quantity: m.quantity } : {}),
      ...(m.scale !== undefined ? { scale: m.scale } : {}),
      ...(m.phase !== undefined ? { phase: m.phase } : {}),
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

/**
 * Imports and analyses a capture, and keeps the first few cycles of each channel for the
 * waveform chart (at most `maxPoints` points per channel).
 *
 * @throws AnalysisInputError for every problem with the file or the mapping.
 */
export function analyzeCaptureText(
  text: string,
  mapping: CaptureMapping,
  context: EvaluationContext,
  { cycles = 3, maxPoints = 600 }: { cycles?: number; maxPoints?: number } = {},
): { analysis: AnalysisResult; waveform: Waveform } {
  const options = analysisOptionsFrom(mapping, context);
  const ignored = new Set(Object.entries(mapping.channels).filter(([, m]) => m.ignore).map(([n]) => n.toLowerCase()));
  const imported = importCsvText(text, { channels: options.channels, sampleIntervalS: options.sampleIntervalS });
  const channels = imported.channels.filter((c) => !ignored.has(c.name.toLowerCase()));
  const analysis = analyzeImported({ ...imported, channels }, options);
  const spanS = cycles / analysis.fundamentalHz;
  const count = Math.min(imported.rowCount, Math.ceil(spanS / imported.sampleIntervalS));
  const step = Math.max(1, Math.ceil(count / maxPoints));
  const timeS: number[] = [];
  for (let i = 0; i < count; i += step) timeS.push(i * imported.sampleIntervalS);
  const waveform: Waveform = {
    timeS,
    channels: channels.map((c) => {
      const values: number[] = [];
      for (let i = 0; i < count; i += step) values.push(c.samples[i] ?? 0);
      return { name: c.name, unit: c.unit, values };
    }),
  };
  return { analysis, waveform };
}

/** Judges an analysis against one limit-set revision. */
export function evaluateCapture(
  analysis: AnalysisResult,
  limitSet: { key: string; name: string; revisionId: string; revisionNumber: number; content: LimitSetRevisionContent },
  context: EvaluationContext,
): ComplianceResult {
  return evaluateCompliance({
    analysis,
    limitSet: { key: limitSet.key, name: limitSet.name, revision: { id: limitSet.revisionId, number: limitSet.revisionNumber }, content: limitSet.content },
    context,
  });
}
