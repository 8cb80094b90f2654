// A preview of a CSV export for the upload mapping form: what was detected, nothing analysed.
import { detectLayout, type PreambleEntry } from "./detect-layout";
import { backwardsTimeError } from "./fit-sample-interval";
import { intervalFromPreamble } from "./interval-from-preamble";
import { LineFit } from "./line-fit";
import { parseNumber } from "./parse-number";
import { planColumns } from "./plan-columns";
import type { ChannelOverride, PhaseLabel, Quantity } from "./types";

/** What {@link inspectCsv} found. Line numbers are 1-based. */
export interface CsvPreview {
  delimiter: "," | ";" | "\t";
  decimalSeparator: "." | ",";
  preamble: PreambleEntry[];
  headerLine: number | null;
  unitsLine: number | null;
  dataStartLine: number;
  columns: {
    /** 1-based column. */
    column: number;
    header: string;
    name: string;
    unit: string | null;
    role: "time" | "channel" | "skipped";
    quantity: Quantity | null;
    phase: PhaseLabel | null;
    note: string | null;
  }[];
  /** From the time column (fit over the previewed rows) or the preamble; null when neither states it. */
  sampleIntervalS: number | null;
  sampleIntervalSource: "time-column" | "preamble" | null;
  /** Numeric data rows in the previewed text. */
  previewRows: number;
  /** Why the time column cannot give the interval (it runs backwards), with its line; null when it can or there is none. */
  timeAxisProblem: string | null;
}

/**
 * Detects the layout of a CSV export (delimiter, decimal comma, preamble, header, units, time
 * column, channel quantities and phases, sample interval) from its text or its first part,
 * without analysing it. The upload form shows this and lets the user correct the mapping.
 *
 * Complexity O(text length).
 *
 * @param text the file or its first part (e.g. 256 KB); a last incomplete line is ignored.
 * @throws AnalysisInputError "empty-file" or "no-numeric-columns".
 * @example
 * inspectCsv("Time (s),Va (V),Ia (A)\n0,1,2\n0.0001,3,4\n").columns.map((c) => c.quantity) // [null, "voltage", "current"]
 */
export function inspectCsv(text: string, overrides?: Record<string, ChannelOverride>): CsvPreview {
  const layout = detectLayout(text, false);
  const columns = planColumns(layout, overrides);
  const lines = text.split(layout.newline).slice(layout.dataStartLine - 1);
  const time = columns.find((c) => c.role === "time");
  const times: number[] = [];
  let previewRows = 0;
  let timeAxisProblem: string | null = null;
  for (let offset = 0; offset < lines.length; offset++) {
    const fields = lines[offset]!.split(layout.delimiter);
    if (fields.length < layout.columnCount) continue;
    previewRows++;
    if (time) {
      const t = parseNumber(fields[time.index]!.trim(), layout.decimalComma);
      if (Number.isNaN(t)) continue;
      const previous = times[times.length - 1];
      if (previous !== undefined && t * time.toBase < previous && timeAxisProblem === null) {
        timeAxisProblem = backwardsTimeError(layout.dataStartLine + offset, time.index + 1, t * time.toBase, previous).message;
      }
      times.push(t * time.toBase);
    }
  }
  let sampleIntervalS: number | null = null;
  let sampleIntervalSource: CsvPreview["sampleIntervalSource"] = null;
  if (timeAxisProblem !== null) {
    // No interval from a column that runs backwards: the problem is shown instead of asking for one.
  } else if (time && times.length >= 2) {
    // The slope of the preview rows' time stamps against their index (the analysis fits the whole column the same way).
    const fit = new LineFit();
    times.forEach((t, i) => fit.add(i, t));
    if (fit.slope() > 0) {
      sampleIntervalS = fit.slope();
      sampleIntervalSource = "time-column";
    }
  } else {
    const stated = intervalFromPreamble(layout.preamble, layout.decimalComma);
    if (stated) {
      sampleIntervalS = stated.sampleIntervalS;
      sampleIntervalSource = "preamble";
    }
  }
  return {
    delimiter: layout.delimiter,
    decimalSeparator: layout.decimalComma ? "," : ".",
    preamble: layout.preamble,
    headerLine: layout.headerLine,
    unitsLine: layout.unitsLine,
    dataStartLine: layout.dataStartLine,
    columns: columns.map((c) => ({
      column: c.index + 1,
      header: c.header,
      name: c.name,
      unit: c.unitText,
      role: c.role,
      quantity: c.quantity,
      phase: c.phase,
      note: c.note,
    })),
    sampleIntervalS,
    sampleIntervalSource,
    previewRows,
    timeAxisProblem,
  };
}
