// CSV import: layout detection on the head, then papaparse over the whole text or a file stream
// into Float64Array buffers (no per-row objects are kept).
import { createReadStream } from "node:fs";
import { open, stat } from "node:fs/promises";
import Papa from "papaparse";
import { detectLayout, type CsvLayout } from "./detect-layout";
import { AnalysisInputError } from "./errors";
import { fitSampleInterval } from "./fit-sample-interval";
import { intervalFromPreamble } from "./interval-from-preamble";
import { parseNumber } from "./parse-number";
import { planColumns, type ColumnPlan } from "./plan-columns";
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

const HEAD_BYTES = 256 * 1024;
const POW10 = Array.from({ length: 23 }, (_, k) => 10 ** k);

/** Collects papaparse rows into buffers and checks them; shared by the text and the stream path. */
class RowCollector {
  private lineNo = 0;
  private readonly starts: number;
  private readonly timeColumn: ColumnPlan | undefined;
  private readonly channelColumns: ColumnPlan[];
  private readonly buffers: SampleBuffer[];
  private readonly times: SampleBuffer | null;
  private readonly decimalComma: boolean;
  private readonly columnCount: number;
  /** Row indices after which blank lines were skipped, with the count (for line numbers). */
  private readonly gaps: { row: number; lines: number }[] = [];
  private firstTimeText = "";
  private lastTimeText = "";
  /** Where the last fast-path row is, so its time text is only cut out once, at the end. */
  private lastBlock: string | null = null;
  private lastLineStart = 0;
  private lastLineEnd = 0;
  private readonly delimiterCode: number;
  private readonly decimalCode: number;
  private readonly channelSlots: Int32Array;
  private readonly timeSlot: number;
  private readonly timeToBase: number;
  private readonly rowValues: Float64Array;
  rows = 0;

  constructor(
    readonly layout: CsvLayout,
    readonly columns: ColumnPlan[],
    expectedRows: number,
  ) {
    this.starts = layout.dataStartLine;
    this.decimalComma = layout.decimalComma;
    this.columnCount = layout.columnCount;
    this.timeColumn = columns.find((c) => c.role === "time");
    this.channelColumns = columns.filter((c) => c.role === "channel");
    this.buffers = this.channelColumns.map(() => new SampleBuffer(expectedRows));
    this.times = this.timeColumn ? new SampleBuffer(expectedRows) : null;
    this.delimiterCode = layout.delimiter.charCodeAt(0);
    this.decimalCode = layout.decimalComma ? 44 : 46;
    this.channelSlots = Int32Array.from(this.channelColumns.map((c) => c.index));
    this.timeSlot = this.timeColumn?.index ?? 0;
    this.timeToBase = this.timeColumn?.toBase ?? 1;
    this.rowValues = new Float64Array(layout.columnCount);
  }

  lineOfRow = (row: number): number => {
    let line = this.starts + row;
    for (const gap of this.gaps) {
      if (gap.row <= row) line += gap.lines;
      else break;
    }
    return line;
  };

  addRows(data: string[][]): void {
    const { decimalComma, columnCount, channelColumns, buffers, times, timeColumn } = this;
    for (let r = 0; r < data.length; r++) {
      const row = data[r]!;
      const line = ++this.lineNo;
      if (line < this.starts) continue;
      if (row.length === 1 && row[0]!.trim() === "") {
        const last = this.gaps[this.gaps.length - 1];
        if (last && last.row === this.rows) last.lines++;
        else this.gaps.push({ row: this.rows, lines: 1 });
        continue;
      }
      if (row.length < columnCount) {
        const filled = row.filter((f) => f.trim() !== "").length;
        throw new AnalysisInputError(
          "ragged-row",
          `line ${line} has ${filled} field${filled === 1 ? "" : "s"} where the header has ${columnCount} columns (truncated or malformed row)`,
          { line, column: row.length + 1 },
        );
      }
      if (times && timeColumn) {
        const cell = row[timeColumn.index]!;
        const t = parseNumber(cell, decimalComma);
        if (Number.isNaN(t)) throw nonNumeric(line, timeColumn, cell);
        times.push(t * timeColumn.toBase);
        if (this.rows === 0) this.firstTimeText = cell;
        this.lastTimeText = cell;
        this.lastBlock = null;
      }
      for (let c = 0; c < channelColumns.length; c++) {
        const plan = channelColumns[c]!;
        const cell = row[plan.index]!;
        const v = parseNumber(cell, decimalComma);
        if (Number.isNaN(v)) throw nonNumeric(line, plan, cell);
        buffers[c]!.push(v);
      }
      this.rows++;
    }
  }

  /**
   * Fast path for plain numeric text (no quotes): scans complete lines of `block` straight from
   * character codes into the buffers, without per-row arrays or substrings. Any line it cannot
   * read exactly (whitespace, unusual number forms, wrong field count, text) goes through
   * {@link addRows} so the checks and messages are identical.
   */
  addPlainLines(block: string): void {
    const { columnCount, delimiterCode, decimalCode, buffers, times, channelSlots, timeSlot, timeToBase } = this;
    const values = this.rowValues;
    const length = block.length;
    let pos = 0;
    while (pos < length) {
      let end = block.indexOf("\n", pos);
      if (end < 0) end = length;
      let lineEnd = end;
      if (lineEnd > pos && block.charCodeAt(lineEnd - 1) === 13) lineEnd--;
      const lineStart = pos;
      pos = end + 1;
      if (this.lineNo + 1 < this.starts) {
        this.lineNo++;
        continue;
      }
      if (lineEnd === lineStart) {
        this.addRows([[""]]);
        continue;
      }
      // Parse up to columnCount fields with the exact fast path (integer mantissa / power of ten).
      let field = 0;
      let i = lineStart;
      let ok = true;
      while (field < columnCount) {
        let negative = false;
        let c = block.charCodeAt(i);
        if (c === 45 || c === 43) {
          negative = c === 45;
          c = block.charCodeAt(++i);
        }
        let mantissa = 0;
        let digits = 0;
        let scale = 0;
        while (c >= 48 && c <= 57) {
          mantissa = mantissa * 10 + (c - 48);
          digits++;
          c = block.charCodeAt(++i);
        }
        if (c === decimalCode) {
          c = block.charCodeAt(++i);
          while (c >= 48 && c <= 57) {
            mantissa = mantissa * 10 + (c - 48);
            digits++;
            scale--;
            c = block.charCodeAt(++i);
          }
        }
        if (digits === 0 || digits > 15) {
          ok = false;
          break;
        }
        if (c === 101 || c === 69) {
          c = block.charCodeAt(++i);
          let expNegative = false;
          if (c === 45 || c === 43) {
            expNegative = c === 45;
            c = block.charCodeAt(++i);
          }
          let exponent = 0;
          let expDigits = 0;
          while (c >= 48 && c <= 57 && expDigits < 4) {
            exponent = exponent * 10 + (c - 48);
            expDigits++;
            c = block.charCodeAt(++i);
          }
          if (expDigits === 0) {
            ok = false;
            break;
          }
          scale += expNegative ? -exponent : exponent;
        }
        if (scale < -22 || scale > 22) {
          ok = false;
          break;
        }
        // One correctly rounded operation on exact operands: the same double as Number(text).
        const magnitude = scale < 0 ? mantissa / POW10[-scale]! : mantissa * POW10[scale]!;
        values[field++] = negative ? -magnitude : magnitude;
        if (i >= lineEnd) break;
        if (c !== delimiterCode) {
          ok = false;
          break;
        }
        i++;
      }
      // Trailing fields beyond the columns must be empty delimiters only (as addRows accepts any extra).
      if (!ok || field < columnCount) {
        this.addRows([block.slice(lineStart, lineEnd).split(this.layout.delimiter)]);
        continue;
      }
      this.lineNo++;
      if (times) {
        const t = values[timeSlot]! * timeToBase;
        times.push(t);
        if (this.rows === 0) this.firstTimeText = block.slice(lineStart, lineEnd).split(this.layout.delimiter)[timeSlot] ?? "";
        this.lastLineStart = lineStart;
        this.lastLineEnd = lineEnd;
        this.lastBlock = block;
      }
      for (let c = 0; c < channelSlots.length; c++) buffers[c]!.push(values[channelSlots[c]!]!);
      this.rows++;
    }
  }

  finish(options: ImportOptions): ImportedCapture {
    if (this.lastBlock !== null) {
      this.lastTimeText = this.lastBlock.slice(this.lastLineStart, this.lastLineEnd).split(this.layout.delimiter)[this.timeSlot] ?? "";
      this.lastBlock = null;
    }
    const warnings: string[] = [];
    for (const plan of this.columns) if (plan.note) warnings.push(plan.note);
    if (this.rows === 0) {
      throw new AnalysisInputError("no-numeric-columns", "no numeric columns: the file has a header but no data rows");
    }
    if (this.channelColumns.length === 0) {
      throw new AnalysisInputError(
        "no-channels",
        "no current or voltage channel: no column is named or unit-marked as a current or voltage (map the columns to analyse them)",
      );
    }
    let sampleIntervalS: number;
    let sampleIntervalSource: ImportedCapture["sampleIntervalSource"];
    if (options.sampleIntervalS !== undefined) {
      if (!(options.sampleIntervalS > 0) || !Number.isFinite(options.sampleIntervalS)) {
        throw new AnalysisInputError("invalid-option", `sample interval must be a positive number of seconds, got ${options.sampleIntervalS}`);
      }
      sampleIntervalS = options.sampleIntervalS;
      sampleIntervalSource = "option";
    } else if (this.times && this.timeColumn) {
      const resolution = Math.max(printedResolution(this.firstTimeText), printedResolution(this.lastTimeText)) * this.timeColumn.toBase;
      sampleIntervalS = fitSampleInterval(this.times.values(), resolution, this.lineOfRow, this.timeColumn.index + 1).intervalS;
      sampleIntervalSource = "time-column";
    } else {
      const stated = intervalFromPreamble(this.layout.preamble, this.layout.decimalComma);
      if (!stated) {
        throw new AnalysisInputError(
          "no-sample-interval",
          "no sample interval: the file has no time column and its preamble states no sample interval or rate (give the interval in seconds)",
        );
      }
      sampleIntervalS = stated.sampleIntervalS;
      sampleIntervalSource = "preamble";
    }
    const channels = this.channelColumns.map((plan, c): ImportedChannel => {
      const samples = this.buffers[c]!.values();
      const factor = plan.toBase * plan.scale;
      if (factor !== 1) for (let i = 0; i < samples.length; i++) samples[i]! *= factor;
      return {
        name: plan.header,
        quantity: plan.quantity!,
        phase: plan.phase,
        unit: plan.quantity === "current" ? "A" : "V",
        scale: plan.scale,
        column: plan.index + 1,
        samples,
      };
    });
    return {
      layout: this.layout,
      columns: this.columns,
      sampleIntervalS,
      sampleIntervalSource,
      rowCount: this.rows,
      channels,
      warnings,
    };
  }
}

function nonNumeric(line: number, plan: ColumnPlan, cell: string): AnalysisInputError {
  const shown = cell.length > 24 ? `${cell.slice(0, 24)}…` : cell;
  const what = cell.trim() === "" ? "an empty cell" : `"${shown}", not a number`;
  return new AnalysisInputError("non-numeric-cell", `non-numeric cell at line ${line}, column ${plan.index + 1} (${plan.header}): ${what}`, {
    line,
    column: plan.index + 1,
  });
}

/** The step the last printed digit of a time stamp stands for ("0.00125" → 1e-5, "1.25e-3" → 1e-5). */
function printedResolution(cell: string): number {
  const match = /^\s*[-+]?\d*[.,]?(\d*)(?:[eE]([-+]?\d+))?\s*$/.exec(cell);
  if (!match) return 0;
  return 10 ** (Number(match[2] ?? 0) - (match[1]?.length ?? 0));
}

/**
 * Streams a file whose head is plain (no quotes): complete lines of each 1 MB chunk go through the
 * fast scanner; a chunk that does contain quotes goes through papaparse, which handles quoting.
 */
async function readPlain(path: string, collector: RowCollector): Promise<void> {
  const stream = createReadStream(path, { encoding: "utf8", highWaterMark: 1 << 20 });
  let partial = "";
  let first = true;
  const consume = (block: string): void => {
    if (block.includes('"')) {
      const rows = Papa.parse<string[]>(block, { delimiter: collector.layout.delimiter, newline: "\n" }).data;
      // papaparse yields a last empty row for the final newline of the block; addRows counts it as a line otherwise.
      if (block.endsWith("\n")) rows.pop();
      collector.addRows(rows.map((r) => r.map((f) => f.replace(/\r$/, ""))));
    } else {
      collector.addPlainLines(block);
    }
  };
  try {
    for await (const chunk of stream as AsyncIterable<string>) {
      let text = partial + chunk;
      if (first && text.charCodeAt(0) === 0xfeff) text = text.slice(1);
      first = false;
      const cut = text.lastIndexOf("\n");
      if (cut < 0) {
        partial = text;
        continue;
      }
      partial = text.slice(cut + 1);
      consume(text.slice(0, cut + 1));
    }
  } catch (error) {
    stream.destroy();
    if (error instanceof AnalysisInputError) throw error;
    throw new AnalysisInputError("unreadable-file", `cannot read file ${path}: ${error instanceof Error ? error.message : String(error)}`);
  }
  if (partial.length > 0) consume(partial);
}

/** Plain numeric text (no quotes, \n or \r\n line ends) can take the fast path. */
function isPlain(layout: CsvLayout, text: string): boolean {
  return layout.newline !== "\r" && !text.includes('"');
}

function checkOverrides(options: ImportOptions): void {
  for (const [name, override] of Object.entries(options.channels ?? {})) {
    if (override.scale !== undefined && (!Number.isFinite(override.scale) || override.scale === 0)) {
      throw new AnalysisInputError("invalid-option", `scale factor for channel ${name} must be a non-zero number, got ${override.scale}`);
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
  const collector = new RowCollector(layout, planColumns(layout, options.channels), 1024);
  const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  if (isPlain(layout, body)) {
    collector.addPlainLines(body);
    return collector.finish(options);
  }
  Papa.parse<string[]>(body, {
    delimiter: layout.delimiter,
    newline: layout.newline,
    chunkSize: 1 << 20,
    chunk: (results: Papa.ParseResult<string[]>) => collector.addRows(results.data),
    // String input is parsed synchronously: complete runs before Papa.parse returns.
    complete: () => undefined,
  });
  return collector.finish(options);
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
  let size: number;
  let head: string;
  try {
    size = (await stat(path)).size;
    const handle = await open(path, "r");
    try {
      const buffer = Buffer.alloc(Math.min(size, HEAD_BYTES));
      const { bytesRead } = await handle.read(buffer, 0, buffer.length, 0);
      head = buffer.subarray(0, bytesRead).toString("utf8");
    } finally {
      await handle.close();
    }
  } catch (error) {
    const reason = error instanceof Error && "code" in error ? String((error as NodeJS.ErrnoException).code) : "read error";
    throw new AnalysisInputError("unreadable-file", `cannot read file ${path}: ${reason}`);
  }
  const complete = size <= HEAD_BYTES;
  const layout = detectLayout(head, complete);
  const headLines = head.split(layout.newline);
  const sampleLines = headLines.slice(layout.dataStartLine - 1, -1);
  const bytesPerRow = sampleLines.length > 0 ? sampleLines.reduce((sum, l) => sum + l.length + layout.newline.length, 0) / sampleLines.length : 64;
  const collector = new RowCollector(layout, planColumns(layout, options.channels), (size / bytesPerRow) * 1.02 + 16);

  if (layout.newline !== "\r" && !head.includes('"')) {
    await readPlain(path, collector);
    return collector.finish(options);
  }
  await new Promise<void>((resolve, reject) => {
    const stream = createReadStream(path, { encoding: "utf8", highWaterMark: 1 << 20 });
    let failed = false;
    const fail = (error: unknown): void => {
      if (failed) return;
      failed = true;
      stream.destroy();
      reject(error);
    };
    stream.on("error", (error) => fail(new AnalysisInputError("unreadable-file", `cannot read file ${path}: ${error.message}`)));
    Papa.parse<string[]>(stream as unknown as File, {
      delimiter: layout.delimiter,
      newline: layout.newline,
      beforeFirstChunk: (chunk) => (chunk.charCodeAt(0) === 0xfeff ? chunk.slice(1) : chunk),
      chunk: (results, parser) => {
        if (failed) return;
        try {
          collector.addRows(results.data);
        } catch (error) {
          fail(error); // before abort(): abort() calls complete synchronously
          parser.abort();
        }
      },
      complete: () => {
        if (!failed) resolve();
      },
      error: (error: Error) => fail(new AnalysisInputError("unreadable-file", `cannot read file ${path}: ${error.message}`)),
    });
  });
  return collector.finish(options);
}
