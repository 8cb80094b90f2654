// Where an interval log's table starts and how its cells are separated — found once, from the
// file's first lines, for the preview and the import alike.
import Papa from "papaparse";
import { parseTimestamp } from "./parse-timestamp";

export interface IntervalLayout {
  /** 1-based line of the header row. */
  headerLine: number;
  delimiter: "," | ";" | "\t";
  decimalSeparator: "." | ",";
  headers: string[];
  /** The first data rows (up to 5), split into cells. */
  sample: string[][];
}

const headLines = 205;

/** Cells of one parsed row, trimmed. */
export function trimCells(row: string[]): string[] {
  return row.map((cell) => cell.trim());
}

/**
 * Finds the header row of an interval log — the first line of ≥ 2 cells followed by a line with
 * the same cell count whose first cell (or first two, date and time) holds a timestamp — trying
 * `;`, tab and `,` as delimiters (quotes as RFC 4180, via papaparse), and the decimal separator
 * (a comma when the delimiter is not one and the first data cells look like "1,23").
 *
 * Complexity O(first 200 lines). Returns null when no such header row exists.
 *
 * @example
 * detectIntervalLayout("Time;I1 H5 [A]\n2024-03-04 00:00;1,5\n")?.decimalSeparator // ","
 */
export function detectIntervalLayout(text: string): IntervalLayout | null {
  const head = text.replace(/^\uFEFF/, "");
  const parsed = ([";", "\t", ","] as const).map((delimiter) => ({
    delimiter,
    rows: Papa.parse<string[]>(head, { delimiter, preview: headLines, skipEmptyLines: false }).data.map(trimCells),
  }));
  const lineCount = Math.min(...parsed.map((p) => p.rows.length));
  for (let i = 0; i < Math.min(lineCount - 1, headLines - 5); i++) {
    for (const { delimiter, rows } of parsed) {
      const headers = rows[i]!;
      const next = rows[i + 1]!;
      if (headers.length < 2 || next.length !== headers.length) continue;
      const stamped = parseTimestamp(next[0]!) !== null || (next.length > 1 && parseTimestamp(`${next[0]} ${next[1]}`) !== null);
      if (!stamped) continue;
      const sample = rows.slice(i + 1, i + 6).filter((row) => !(row.length === 1 && row[0] === ""));
      const decimalSeparator = delimiter !== "," && sample.some((row) => row.some((cell) => /^[+-]?\d+,\d+$/.test(cell))) ? "," : ".";
      return { headerLine: i + 1, delimiter, decimalSeparator, headers, sample };
    }
  }
  return null;
}
