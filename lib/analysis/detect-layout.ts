// Reads the head of a CSV export and works out how the rest of it is laid out.
import type { TextEncodingName } from "./detect-encoding";
import { AnalysisInputError } from "./errors";
import { parseNumber } from "./parse-number";
import { parseUnit } from "./parse-unit";

/** One key/value line above the header (record length, sample interval, units…). */
export interface PreambleEntry {
  key: string;
  value: string;
  /** 1-based line number. */
  line: number;
}

/** How a CSV export is laid out; line numbers are 1-based. */
export interface CsvLayout {
  delimiter: "," | ";" | "\t";
  decimalComma: boolean;
  newline: "\n" | "\r\n" | "\r";
  preamble: PreambleEntry[];
  headerLine: number | null;
  unitsLine: number | null;
  /** Line number of the first data row. */
  dataStartLine: number;
  /** Header cells (raw text), or generated names "Column 1"… when the file has no header. */
  headers: string[];
  /** Unit cells from a separate units row, aligned with `headers`; null without a units row. */
  units: (string | null)[] | null;
  /** Number of data columns (trailing empty fields are not columns). */
  columnCount: number;
  /** The file's text encoding, detected once from its head; set by the file readers (text input is decoded already). */
  encoding?: TextEncodingName;
}

const DELIMITERS = [",", ";", "\t"] as const;
const HEAD_LINES_SCORED = 60;

function splitLine(line: string, delimiter: string): string[] {
  const fields = line.split(delimiter).map((f) => f.trim().replace(/^"(.*)"$/, "$1").trim());
  while (fields.length > 0 && fields[fields.length - 1] === "") fields.pop();
  return fields;
}

function isNumericRow(fields: string[], decimalComma: boolean): boolean {
  return fields.length > 0 && fields.every((f) => !Number.isNaN(parseNumber(f, decimalComma)));
}

function isUnitsRow(fields: string[], columnCount: number): boolean {
  if (fields.length === 0 || fields.length > columnCount) return false;
  const nonEmpty = fields.filter((f) => f !== "");
  return nonEmpty.length > 0 && nonEmpty.every((f) => parseUnit(f) !== null || /^[([]?-?[)\]]?$/.test(f));
}

/**
 * Detects delimiter (`,` `;` tab), decimal comma, line ending, key/value preamble, header row,
 * optional units row and where data starts, from the first part of the file. The data block is
 * the first run of at least two numeric rows whose column count is the most common one among
 * the scored rows; the header is the non-numeric row right above it (or above its units row).
 *
 * Complexity O(length of `head`).
 *
 * @param head the start of the file (the whole text for small files); a last incomplete line is ignored unless `complete`.
 * @throws AnalysisInputError "empty-file" or "no-numeric-columns".
 * @example
 * detectLayout("Time (s);Ia (A)\n0;1,5\n0,001;1,6\n", true)
 * // { delimiter: ";", decimalComma: true, headerLine: 1, dataStartLine: 2, headers: ["Time (s)", "Ia (A)"], … }
 */
export function detectLayout(head: string, complete: boolean): CsvLayout {
  const text = head.charCodeAt(0) === 0xfeff ? head.slice(1) : head;
  if (text.trim().length === 0) throw new AnalysisInputError("empty-file", "the file is empty");
  const newline = text.includes("\r\n") ? "\r\n" : text.includes("\n") ? "\n" : text.includes("\r") ? "\r" : "\n";
  const lines = text.split(newline);
  if (!complete && lines.length > 1) lines.pop();

  // Score each delimiter / decimal-separator combination on the last lines of the head.
  const scored = lines.filter((l) => l.trim() !== "").slice(-HEAD_LINES_SCORED);
  let best: { delimiter: (typeof DELIMITERS)[number]; decimalComma: boolean; columns: number; score: number } | null = null;
  for (const delimiter of DELIMITERS) {
    for (const decimalComma of delimiter === "," ? [false] : [false, true]) {
      const counts = new Map<number, number>();
      for (const line of scored) {
        const fields = splitLine(line, delimiter);
        if (isNumericRow(fields, decimalComma)) counts.set(fields.length, (counts.get(fields.length) ?? 0) + 1);
      }
      for (const [columns, rows] of counts) {
        const score = rows * columns;
        if (best === null || score > best.score || (score === best.score && columns > best.columns)) {
          best = { delimiter, decimalComma, columns, score };
        }
      }
    }
  }
  if (best === null) {
    throw new AnalysisInputError("no-numeric-columns", "no numeric columns: no row of the file holds only numbers");
  }
  const { delimiter, decimalComma, columns } = best;

  const rowIsData = (index: number): boolean => {
    const line = lines[index];
    if (line === undefined) return false;
    const fields = splitLine(line, delimiter);
    return fields.length === columns && isNumericRow(fields, decimalComma);
  };
  let dataIndex = -1;
  for (let i = 0; i < lines.length; i++) {
    if (!rowIsData(i)) continue;
    let next = i + 1;
    while (next < lines.length && lines[next]!.trim() === "") next++;
    if (next >= lines.length || rowIsData(next)) {
      dataIndex = i;
      break;
    }
  }
  if (dataIndex < 0) {
    throw new AnalysisInputError("no-numeric-columns", "no numeric columns: no block of numeric data rows found");
  }

  let above = dataIndex - 1;
  while (above >= 0 && lines[above]!.trim() === "") above--;
  let unitsIndex: number | null = null;
  let units: (string | null)[] | null = null;
  if (above >= 0 && isUnitsRow(splitLine(lines[above]!, delimiter), columns)) {
    const fields = splitLine(lines[above]!, delimiter);
    // A units row needs a header above it; a lone "A;V" line directly above data is taken as units only then.
    let headerCandidate = above - 1;
    while (headerCandidate >= 0 && lines[headerCandidate]!.trim() === "") headerCandidate--;
    if (headerCandidate >= 0 && splitLine(lines[headerCandidate]!, delimiter).length === columns) {
      unitsIndex = above;
      units = Array.from({ length: columns }, (_, i) => (fields[i] ? fields[i]! : null));
      above = headerCandidate;
    }
  }
  let headerIndex: number | null = null;
  if (above >= 0) {
    const fields = splitLine(lines[above]!, delimiter);
    const textual = fields.some((f) => f !== "" && Number.isNaN(parseNumber(f, decimalComma)));
    if (fields.length >= columns && textual) headerIndex = above;
  }
  const headerFields = headerIndex === null ? [] : splitLine(lines[headerIndex]!, delimiter);
  const headers = Array.from({ length: columns }, (_, i) => headerFields[i] || `Column ${i + 1}`);

  const preamble: PreambleEntry[] = [];
  const preambleEnd = headerIndex ?? unitsIndex ?? dataIndex;
  for (let i = 0; i < preambleEnd; i++) {
    const line = lines[i]!.trim();
    if (line === "") continue;
    let fields = splitLine(line, delimiter).filter((f) => f !== "");
    if (fields.length < 2) {
      const kv = /^([^:=]+?)\s*[:=]\s*(.+)$/.exec(line.replace(/^"|"$/g, ""));
      fields = kv ? [kv[1]!, kv[2]!] : fields;
    }
    if (fields.length >= 2) {
      preamble.push({ key: fields[0]!, value: fields.slice(1).join(" "), line: i + 1 });
    } else if (fields.length === 1) {
      preamble.push({ key: fields[0]!, value: "", line: i + 1 });
    }
  }

  return {
    delimiter,
    decimalComma,
    newline,
    preamble,
    headerLine: headerIndex === null ? null : headerIndex + 1,
    unitsLine: unitsIndex === null ? null : unitsIndex + 1,
    dataStartLine: dataIndex + 1,
    headers,
    units,
    columnCount: columns,
  };
}
