// CSV text in, analysis out: the import and the sample pipeline joined (files: analyze-csv-file.ts).
import { analyzeImported } from "./analyze-imported";
import { importCsvText } from "./import-csv";
import type { AnalysisOptions, AnalysisResult } from "./types";

/**
 * Analyses CSV text held in memory (an upload, a test fixture).
 *
 * Complexity O(text length + samples·taps).
 *
 * @throws AnalysisInputError for every input problem, with `line`/`column` where it applies.
 * @example
 * const result = analyzeCsvText(readFileSync("fixtures/single-phase-50hz.csv", "utf8"), { thdMaxOrder: 50 });
 */
export function analyzeCsvText(text: string, options: AnalysisOptions = {}): AnalysisResult {
  const capture = importCsvText(text, pickImport(options));
  return analyzeImported(capture, options);
}

function pickImport(options: AnalysisOptions) {
  return {
    ...(options.sampleIntervalS !== undefined ? { sampleIntervalS: options.sampleIntervalS } : {}),
    ...(options.channels ? { channels: options.channels } : {}),
  };
}
