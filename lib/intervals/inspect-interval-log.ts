import { detectIntervalLayout, type IntervalLayout } from "./detect-interval-layout";
import { suggestIntervalMapping, type IntervalMappingSuggestion } from "./suggest-interval-mapping";

export interface IntervalLogPreview extends IntervalLayout {
  suggestion: IntervalMappingSuggestion;
}

/**
 * Find the header row of an interval log, its delimiter and decimal separator
 * (detectIntervalLayout), and suggest a mapping from its headers — the first step of the mapping form.
 *
 * Complexity O(first lines). Throws when no header row followed by timestamped data is found.
 *
 * @example
 * inspectIntervalLog(csv).suggestion.mapping // draft mapping for importIntervalLog
 */
export function inspectIntervalLog(text: string): IntervalLogPreview {
  const layout = detectIntervalLayout(text);
  if (!layout) throw new Error("inspectIntervalLog requires a header row followed by a row starting with a timestamp");
  return { ...layout, suggestion: suggestIntervalMapping(layout.headers) };
}
