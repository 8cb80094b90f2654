// Public API of interval-log import and evaluation (pure: no framework, database or storage imports).
export { evaluateIntervalLog, type IntervalLogEvaluation, type IntervalTrend, type IntervalTrendSeries } from "./evaluate-interval-log";
export { importIntervalLog } from "./import-interval-log";
export { importIntervalLogFile } from "./import-interval-log-file";
export { thinIntervalTrends } from "./thin-interval-trends";
export { inspectIntervalLog, type IntervalLogPreview } from "./inspect-interval-log";
export { IntervalLogError, type IntervalLogIssue } from "./errors";
export { parseTimestamp, TIMESTAMP_FORMATS_TEXT } from "./parse-timestamp";
export { suggestIntervalMapping, type IntervalColumnSuggestion, type IntervalMappingSuggestion } from "./suggest-interval-mapping";
export * from "./types";
