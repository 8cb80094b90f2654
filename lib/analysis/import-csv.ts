// CSV import: layout detection on the head, then papaparse over the whole text or a file stream
// into Float64Array buffers (no per-row objects are kept).
import Papa from "papaparse";
import { detectLayout, type CsvLayout } from "./detect-layout";
import { chooseSampleInterval } from "./choose-sample-interval";
import { AnalysisInputError } from "./errors";
import { backwardsTimeError, fitSampleInterval } from "./fit-sample-interval";
import { intervalFromPreamble } from "./interval-from-preamble";
import { planColumns, type ColumnPlan } from "./plan-columns";
import { readCsvHead, readCsvRows } from "./read-csv-rows";
import { RowCollector, type RowSink } from "./row-collector";
import { SampleBuffer } from "./sample-buffer";
import type { AnalysisOptions, PhaseLabel, Quantity } from "./types";

/** One channel as imported: values in A or V (unit prefix and user scale applied). */
export interface ImportedChannel {
  name: string;
  quantity: Quantity;
  phase: PhaseLabel | null;
  unit: "A" | "V";
  scale: number;
  /** 1-based column in the file. */
  column: number;
  samples: Float64Array;
}

export interface ImportedCapture {
  layout: CsvLayout;
  columns: ColumnPlan[];
  sampleIntervalS: number;
  sampleIntervalSource: "time-column" | "preamble" | "option";
  rowCount: number;
  channels: ImportedChannel[];
  warnings: string[];
}

export type ImportOptions = Pick<AnalysisOptions, "sampleIntervalS" | "channels">;


/** Keeps every chunk: the in-memory import (and the streaming path's look-ahead). */
export class MemorySink implements RowSink {
  readonly channels: SampleBuffer[];
  readonly times: SampleBuffer | null;

  /** @param shared numbers in SharedArrayBuffers (see {@link SampleBuffer}), for the analysis helper thread to read. */
  constructor(channelCount: number, hasTime: boolean, expectedRows: number, shared = false) {
    this.channels = Array.from({ length: channelCount }, () => new SampleBuffer(expectedRows, shared));
    this.times = hasTime ? new SampleBuffer(expectedRows, shared) : null;
  }

  accept(timesS: Float64Array | null, values: Float64Array[], count: number): void {
    if (this.times && timesS) this.times.append(timesS, count);
    for (let c = 0; c < values.length; c++) this.channels[c]!.append(values[c]!, count);
  }
}

/** Builds the imported capture from a collector whose rows have ended and the sink that kept them. */
export function finishImport(collector: RowCollector, sink: MemorySink, options: ImportOptions): ImportedCapture {
  const warnings = collector.end();
  const { timeColumn, channelColumns, layout } = collector;
  const times = sink.times;
  // A given interval replaces the time column's spacing, but a column running backwards is still an error.
  if (options.sampleIntervalS !== undefined && times && timeColumn) {
    const values = times.values();
    for (let i = 1; i < values.length; i++) {
      if (values[i]! < values[i - 1]!) throw backwardsTimeError(collector.lineOfRow(i), timeColumn.index + 1, values[i]!, values[i - 1]!);
    }
  }
  const { sampleIntervalS, sampleIntervalSource } = chooseSampleInterval(
    options.sampleIntervalS,
    times && timeColumn ? () => fitSampleInterval(times.values(), collector.timeResolutionS(), collector.lineOfRow, timeColumn.index + 1).intervalS : null,
    intervalFromPreamble(layout.preamble, layout.decimalComma)?.sampleIntervalS ?? null,
  );
  const channels = channelColumns.map(
    (plan, c): ImportedChannel => ({
      name: plan.header,
      quantity: plan.quantity!,
      phase: plan.phase,
      unit: plan.quantity === "current" ? "A" : "V",
      scale: plan.scale,
      column: plan.index + 1,
      samples: sink.channels[c]!.values(),
    }),
  );
  return { layout, columns: collector.columns, sampleIntervalS, sampleIntervalSource, rowCount: collector.rows, channels, warnings };
}

/** Plain numeric text (no quotes, \n or \r\n line ends) can take the fast path. */
function isPlain(layout: CsvLayout, text: string): boolean {
  return layout.newline !== "\r" && !text.includes('"');
}

export function checkOverrides(options: ImportOptions): void {
  for (const [name, override] of Object.entries(options.channels ?? {})) {
    if (override.scale !== undefined && !(Number.isFinite(override.scale) && override.scale > 0)) {
      throw new AnalysisInputError(
        "invalid-option",
        `scale factor for channel ${name} must be a number greater than zero (A or V per unit recorded), got ${override.scale}`,
      );
    }
  }
}

/**
 * Imports CSV text held in memory (uploads, tests). Same detection and checks as {@link importCsvFile}.
 *
 * Complexity O(n) in the text length; memory: the text plus 8 bytes per sample.
 *
 * @throws AnalysisInputError for every input problem (empty, no numeric columns, non-numeric cell,
 *   ragged row, bad time axis, no interval).
 * @example
 * importCsvText("t (s),Ia (A)\n0,1\n0.0001,2\n").channels[0].samples // Float64Array [1, 2]
 */
export function importCsvText(text: string, options: ImportOptions = {}): ImportedCapture {
  checkOverrides(options);
  const layout = detectLayout(text, true);
  const columns = planColumns(layout, options.channels);
  const sink = new MemorySink(columns.filter((c) => c.role === "channel").length, columns.some((c) => c.role === "time"), 1024);
  const collector = new RowCollector(layout, columns, sink);
  const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  if (isPlain(layout, body)) {
    collector.addPlainLines(body);
    return finishImport(collector, sink, options);
  }
  Papa.parse<string[]>(body, {
    delimiter: layout.delimiter,
    newline: layout.newline,
    chunkSize: 1 << 20,
    chunk: (results: Papa.ParseResult<string[]>) => collector.addRows(results.data),
    // String input is parsed synchronously: complete runs before Papa.parse returns.
    complete: () => undefined,
  });
  return finishImport(collector, sink, options);
}

/**
 * Imports a CSV file as a stream (papaparse over a Node read stream in 1 MB chunks), so a 100 MB+
 * export is never held as text more than one chunk at a time; samples go into Float64Arrays
 * pre-sized from the file size.
 *
 * Complexity O(file size); memory ≈ 8 bytes per sample plus a few MB.
 *
 * @throws AnalysisInputError as {@link importCsvText}, and "unreadable-file" when it cannot be opened.
 * @example
 * const capture = await importCsvFile("fixtures/single-phase-50hz.csv");
 */
export async function importCsvFile(path: string, options: ImportOptions = {}): Promise<ImportedCapture> {
  checkOverrides(options);
  const { head, layout, estimatedRows } = await readCsvHead(path);
  const columns = planColumns(layout, options.channels);
  const sink = new MemorySink(columns.filter((c) => c.role === "channel").length, columns.some((c) => c.role === "time"), estimatedRows * 1.02 + 16);
  const collector = new RowCollector(layout, columns, sink);
  await readCsvRows(path, head, collector);
  return finishImport(collector, sink, options);
}
