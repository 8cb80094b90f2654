// Step 1 of one capture's job: CSV file + mapping → analysis (and the first cycles for the
// waveform chart). The worker, the command line and the demo seed call this — one code path.
import type { AnalysisHelper } from "@/lib/analysis/analysis-helper";
import { analyzeCsvFile } from "@/lib/analysis/analyze-csv-file";
import type { AnalysisResult } from "@/lib/analysis/types";
import type { EvaluationContext } from "@/lib/compliance/model";
import type { CaptureMapping } from "@/lib/validations/capture";
import { analysisOptionsFrom } from "./analysis-options-from";
import { checkMappingColumns } from "./check-mapping-columns";
import type { Waveform } from "./types";

/**
 * Analyses a capture file on disk as a stream (memory does not grow with the record's length)
 * and keeps the first few cycles of each channel for the waveform chart.
 *
 * @param helper a second thread to measure in (see AnalysisHelper; the command line passes one):
 *   the same result, sooner.
 * @throws AnalysisInputError for every problem with the file or the mapping (including a mapped
 *   column the file does not have).
 */
export async function runCaptureAnalysis(
  path: string,
  mapping: CaptureMapping,
  context: EvaluationContext,
  { cycles = 3, helper = null }: { cycles?: number; helper?: AnalysisHelper | null } = {},
): Promise<{ analysis: AnalysisResult; waveform: Waveform | null }> {
  await checkMappingColumns(path, mapping);
  const { waveform = null, ...analysis } = await analyzeCsvFile(path, { ...analysisOptionsFrom(mapping, context), ...(cycles > 0 ? { keepWaveformCycles: cycles } : {}) }, undefined, { helper });
  return { analysis, waveform };
}
