// CSV in, analysis out: the import and the sample pipeline joined, for text and for files.
import { analyzeImported } from "./analyze-imported";
import { importCsvText } from "./import-csv";
import { streamCsvAnalysis, type StreamTimings } from "./stream-csv-analysis";
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

/**
 * Analyses a CSV file on disk, streaming: memory does not grow with the record's length (two
 * passes over the file for records longer than ~20 s at 25.6 kS/s; shorter ones are read once
 * and analysed exactly like {@link analyzeCsvText}). See {@link streamCsvAnalysis}.
 *
 * Complexity O(file size + samples·taps); memory ≈ 25 MB for 4 channels plus ≈ 52 numbers per
 * channel per window (3,000 windows for 10 minutes).
 *
 * @param options also `keepWaveformCycles` (result.waveform: first cycles of each channel, ≤ 600 points).
 * @param timings when given, filled with milliseconds per stage (import = pass 1, reread = pass 2 parsing).
 * @throws AnalysisInputError for every input problem, including an unreadable file.
 * @example
 * const result = await analyzeCsvFile("capture.csv", { frequencyHz: 50, channels: { Ia: { scale: 40 } }, keepWaveformCycles: 3 });
 */
export async function analyzeCsvFile(path: string, options: AnalysisOptions = {}, timings?: StreamTimings): Promise<AnalysisResult> {
  return streamCsvAnalysis(path, options, timings);
}

function pickImport(options: AnalysisOptions) {
  return {
    ...(options.sampleIntervalS !== undefined ? { sampleIntervalS: options.sampleIntervalS } : {}),
    ...(options.channels ? { channels: options.channels } : {}),
  };
}
