import { parseTimestamp } from "./parse-timestamp";
import { splitDelimitedLine } from "./split-delimited-line";
import { suggestIntervalMapping, type IntervalMappingSuggestion } from "./suggest-interval-mapping";

export interface IntervalLogPreview {
  /** 1-based line of the header row. */
  headerLine: number;
  delimiter: "," | ";" | "\t";
  decimalSeparator: "." | ",";
  headers: string[];
  /** The first data rows (up to 5), split into cells. */
  sample: string[][];
  suggestion: IntervalMappingSuggestion;
}

/**
 * Find the header row of an interval log (the first line of ≥ 2 cells followed by a line with
 * the same cell count whose first cells hold a timestamp), its delimiter and decimal separator,
 * and suggest a mapping from its headers — the first step of the mapping form.
 *
 * Complexity O(first lines). Throws when no header row followed by timestamped data is found.
 *
 * @example
 * inspectIntervalLog(csv).suggestion.mapping // draft mapping for importIntervalLog
 */
export function inspectIntervalLog(text: string): IntervalLogPreview {
  const lines = text.replace(/^\uFEFF/, "").split(/\r\n|\n|\r/);
  for (let i = 0; i < Math.min(lines.length - 1, 200); i++) {
    for (const delimiter of [";", "\t", ","] as const) {
      const headers = splitDelimitedLine(lines[i]!, delimiter);
      if (headers.length < 2) continue;
      const next = splitDelimitedLine(lines[i + 1]!, delimiter);
      if (next.length !== headers.length) continue;
      const stamped = parseTimestamp(next[0]!) !== null || (next.length > 1 && parseTimestamp(`${next[0]} ${next[1]}`) !== null);
      if (!stamped) continue;
      const sample = lines.slice(i + 1, i + 6).filter((line) => line.trim() !== "").map((line) => splitDelimitedLine(line, delimiter));
      const decimalSeparator = delimiter !== "," && sample.some((row) => row.some((cell) => /^[+-]?\d+,\d+$/.test(cell))) ? "," : ".";
      return { headerLine: i + 1, delimiter, decimalSeparator, headers, sample, suggestion: suggestIntervalMapping(headers) };
    }
  }
  throw new Error("inspectIntervalLog requires a header row followed by a row starting with a timestamp");
}
