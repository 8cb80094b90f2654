// Public API of the analysis engine (pure: no framework, database or storage imports).
export { analyzeCsvText } from "./analyze-csv-text";
export { analyzeImported } from "./analyze-imported";
export { analyzeCsvFile, type StreamTimings } from "./analyze-csv-file";
export { analyzeSamples, type SampleCapture, type SampleChannel, type StageTimings } from "./analyze-samples";
export { AnalysisInputError, isAnalysisInputError, type AnalysisErrorCode } from "./errors";
export { estimateFundamental } from "./estimate-fundamental";
export { importCsvFile, importCsvText, type ImportedCapture, type ImportedChannel } from "./import-csv";
export { inspectCsv, type CsvPreview } from "./inspect-csv";
export type * from "./types";
export { parseSensorRating, type SensorRating } from "./parse-sensor-rating";
export { checkOverrideColumns } from "./check-override-columns";
export { readCsvHead, type CsvHead } from "./read-csv-rows";
export { detectEncoding, type TextEncodingName } from "./detect-encoding";
