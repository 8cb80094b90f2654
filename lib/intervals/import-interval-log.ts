import Papa from "papaparse";
import { detectIntervalLayout, trimCells } from "./detect-interval-layout";
import { IntervalLogReader } from "./interval-log-reader";
import type { IntervalLog, IntervalMappingInput } from "./types";

/**
 * Import an interval log held in memory (one row per interval: timestamp + values per channel)
 * with an explicit mapping — usually `suggestIntervalMapping`'s draft, checked by the user.
 * Cells are split by papaparse (quotes as RFC 4180) with the mapping's delimiter, else the one
 * detectIntervalLayout finds in the first lines; rows are checked and converted by
 * IntervalLogReader (A/V × scale; `%` orders × the channel's fundamental; THD in %). For a file
 * on disk use importIntervalLogFile, which streams.
 *
 * Complexity O(rows × columns). Throws IntervalLogError (line and column named) or a zod error for an invalid mapping.
 *
 * @example
 * const log = importIntervalLog(csv, suggestIntervalMapping(headers).mapping!);
 * log.channels[0]?.orders.get(5) // Float64Array of A, one per row
 */
export function importIntervalLog(text: string, mapping: IntervalMappingInput): IntervalLog {
  const body = text.replace(/^\uFEFF/, "");
  const layout = detectIntervalLayout(body.slice(0, 128 * 1024));
  const reader = new IntervalLogReader(mapping, layout?.decimalSeparator ?? ".");
  let line = 0;
  Papa.parse<string[]>(body, {
    delimiter: mapping.delimiter ?? layout?.delimiter ?? ",",
    skipEmptyLines: false,
    step: (results, parser) => {
      line += 1;
      reader.row(trimCells(results.data), line);
      if (reader.full) parser.abort();
    },
  });
  return reader.finish();
}
