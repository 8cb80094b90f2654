// An imported capture analysed in memory: the importer's channels handed to the sample pipeline.
import { analyzeSamples, type StageTimings } from "./analyze-samples";
import type { ImportedCapture } from "./import-csv";
import type { AnalysisOptions, AnalysisResult } from "./types";

/**
 * Analyses a capture the importer has read (unit prefixes and scale factors already applied):
 * passes on only the quantity and phase of each channel override, and reports each channel's
 * scale as imported.
 *
 * Complexity that of {@link analyzeSamples}.
 *
 * @throws AnalysisInputError as analyzeSamples.
 * @example
 * const result = analyzeImported(importCsvText(text), { thdMaxOrder: 50 });
 */
export function analyzeImported(capture: ImportedCapture, options: AnalysisOptions, timings?: StageTimings): AnalysisResult {
  // The importer has applied unit prefixes and scale factors already; pass on quantity and phase only.
  const { sampleIntervalS: _given, channels: overrides, ...rest } = options;
  void _given;
  const kept = Object.fromEntries(
    Object.entries(overrides ?? {}).map(([name, o]) => [
      name,
      { ...(o.quantity ? { quantity: o.quantity } : {}), ...("phase" in o ? { phase: o.phase ?? null } : {}) },
    ]),
  );
  const result = analyzeSamples(
    {
      sampleIntervalS: capture.sampleIntervalS,
      sampleIntervalSource: capture.sampleIntervalSource,
      warnings: capture.warnings,
      channels: capture.channels.map((c) => ({ name: c.name, quantity: c.quantity, phase: c.phase, samples: c.samples })),
    },
    { ...rest, channels: kept },
    timings,
  );
  return withScale(capture, result);
}

function withScale(capture: ImportedCapture, result: AnalysisResult): AnalysisResult {
  for (const channel of result.channels) {
    const imported = capture.channels.find((c) => c.name === channel.name);
    if (imported) channel.scale = imported.scale;
  }
  return result;
}
