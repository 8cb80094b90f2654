// Turns CSV lines into numbers in fixed-size chunks (time column and channel columns, unit
// factors applied) and hands each chunk to a sink: the in-memory import keeps them all, the
// streaming analysis looks at each chunk once. Checks and messages are the same for both.
import type { CsvLayout } from "./detect-layout";
import { AnalysisInputError } from "./errors";
import { parseNumber } from "./parse-number";
import { PlainLineScanner, type ScanLayout } from "./plain-line-scanner";
import type { ColumnPlan } from "./plan-columns";

/** Rows per chunk handed to a {@link RowSink}. */
export const ROW_CHUNK = 1 << 15;

/**
 * Largest magnitude a sample may have once in A, V or s. Squares, products and sums of 10^8
 * samples stay finite in double precision below it (10^100 squared is 10^200, far under the
 * 1.8·10^308 ceiling); from about 1.3·10^154 up a single square is Infinity, which made r.m.s.
 * null and every order "at the limit". No real current, voltage or time comes near it.
 */
export const MAX_SAMPLE_MAGNITUDE = 1e100;

/** Receives parsed rows in chunks: `count` rows starting at row `firstRow` (0-based data row). */
export interface RowSink {
  /** `timesS` (null without a time column) and `values[channel]` hold `count` valid entries; the arrays are reused after the call. */
  accept(timesS: Float64Array | null, values: Float64Array[], count: number, firstRow: number): void;
  /** As accept, for rows that are kept already (see RowCollector.addKeptChunk); only sinks that keep rows have it. */
  acceptKept?(timesS: Float64Array | null, values: Float64Array[], count: number, firstRow: number): void;
}

/**
 * Each channel's first `count` values times its factor (unit prefix × user scale), in place: the one
 * scaling every reader of a file applies, so rows parsed on another thread (parsePart) are the same doubles.
 */
export function applyFactors(channels: Float64Array[], factors: Float64Array, count: number): void {
  for (let c = 0; c < channels.length; c++) {
    const factor = factors[c]!;
    const values = channels[c]!;
    if (factor !== 1) for (let i = 0; i < count; i++) values[i]! *= factor;
  }
}

/**
 * Parses data rows (papaparse rows or plain lines) into chunks for a {@link RowSink}, with line-accurate
 * errors for ragged rows and non-numeric cells. Shared by the text import, the file import and the
 * streaming analysis.
 *
 * Complexity O(characters); memory: one chunk of {@link ROW_CHUNK} rows.
 *
 * @example
 * const collector = new RowCollector(layout, columns, sink); collector.addPlainLines(text); collector.flush();
 */
export class RowCollector {
  private lineNo = 0;
  private readonly starts: number;
  readonly timeColumn: ColumnPlan | undefined;
  readonly channelColumns: ColumnPlan[];
  private readonly buffers: Float64Array[];
  private readonly times: Float64Array | null;
  private readonly factors: Float64Array;
  private fill = 0;
  private readonly decimalComma: boolean;
  private readonly columnCount: number;
  /** Row indices after which blank lines were skipped, with the count (for line numbers). */
  private readonly gaps: { row: number; lines: number }[] = [];
  firstTimeText = "";
  lastTimeText = "";
  /** Decodes a line the fast path hands to addRows (and the time texts it keeps). */
  private readonly decoder = new TextDecoder("utf-8", { ignoreBOM: true });
  private readonly timeSlot: number;
  private readonly scanner: PlainLineScanner;
  rows = 0;

  constructor(
    readonly layout: CsvLayout,
    readonly columns: ColumnPlan[],
    private readonly sink: RowSink,
  ) {
    this.starts = layout.dataStartLine;
    this.decimalComma = layout.decimalComma;
    this.columnCount = layout.columnCount;
    this.timeColumn = columns.find((c) => c.role === "time");
    this.channelColumns = columns.filter((c) => c.role === "channel");
    this.buffers = this.channelColumns.map(() => new Float64Array(ROW_CHUNK));
    this.times = this.timeColumn ? new Float64Array(ROW_CHUNK) : null;
    this.factors = Float64Array.from(this.channelColumns.map((c) => c.toBase * c.scale));
    this.timeSlot = this.timeColumn?.index ?? 0;
    this.scanner = new PlainLineScanner(
      {
        columnCount: layout.columnCount,
        delimiterCode: layout.delimiter.charCodeAt(0),
        decimalCode: layout.decimalComma ? 44 : 46,
        channelSlots: Int32Array.from(this.channelColumns.map((c) => c.index)),
        timeSlot: this.timeSlot,
        timeToBase: this.timeColumn?.toBase ?? 1,
      },
      this.buffers,
      this.times,
    );
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
        times[this.fill] = t * timeColumn.toBase;
        if (this.rows === 0) this.firstTimeText = cell;
        this.lastTimeText = cell;
      }
      for (let c = 0; c < channelColumns.length; c++) {
        const plan = channelColumns[c]!;
        const cell = row[plan.index]!;
        const v = parseNumber(cell, decimalComma);
        if (Number.isNaN(v)) throw nonNumeric(line, plan, cell);
        buffers[c]![this.fill] = v;
      }
      this.rows++;
      if (++this.fill === ROW_CHUNK) this.flush();
    }
  }

  /**
   * Fast path for plain numeric text (no quotes): reads lines straight from their UTF-8 bytes
   * ({@link addPlainBytes}). Any line it cannot read exactly (whitespace, unusual number forms,
   * wrong field count, text) goes through {@link addRows} so the checks and messages are identical.
   */
  addPlainLines(block: string): void {
    this.addPlainBytes(new TextEncoder().encode(block));
  }

  /**
   * {@link addPlainLines} on UTF-8 bytes (`bytes[start..end)`, whole lines), so a file is read
   * without decoding it to text ({@link PlainLineScanner}); a line the scanner cannot read is
   * decoded and handed to {@link addRows}. Stops before the first line holding a double quote and
   * returns its start (`end` when every line was read): quoted fields need a CSV parser.
   */
  addPlainBytes(bytes: Uint8Array, start = 0, end = bytes.length): number {
    if (end > start && bytes[end - 1] !== 10) {
      // The scanner reads whole lines up to a newline: a last line without one is read from a copy that has it.
      const cut = Math.max(start, bytes.lastIndexOf(10, end - 1) + 1);
      const stopped = cut > start ? this.addPlainBytes(bytes, start, cut) : cut;
      if (stopped < cut) return stopped;
      const line = new Uint8Array(end - cut + 1);
      line.set(bytes.subarray(cut, end));
      line[end - cut] = 10;
      return this.addPlainBytes(line) < line.length ? cut : end;
    }
    const scanner = this.scanner;
    let pos = start;
    while (pos < end) {
      if (this.lineNo + 1 < this.starts) {
        this.lineNo++;
        pos = lineEndOf(bytes, pos, end).next;
        continue;
      }
      const room = ROW_CHUNK - this.fill;
      const rows = scanner.scan(bytes, pos, end, this.fill, room);
      if (rows > 0) {
        if (this.rows === 0 && this.times) this.firstTimeText = this.timeText(bytes, pos, lineEndOf(bytes, pos, end).end);
        if (this.times) this.lastTimeText = this.timeText(bytes, scanner.lastLineStart, scanner.lastLineEnd);
        this.lineNo += rows;
        this.rows += rows;
        this.fill += rows;
        if (this.fill === ROW_CHUNK) this.flush();
      }
      pos = scanner.pos;
      // Stopped before the end with room left: a line the scanner cannot read.
      if (pos >= end || rows === room) continue;
      const line = lineEndOf(bytes, pos, end);
      if (bytes.subarray(pos, line.end).indexOf(34) >= 0) return pos;
      this.addRows([this.decodeLine(bytes, pos, line.end).split(this.layout.delimiter)]);
      pos = line.next;
    }
    return end;
  }

  /** The time column's text on one line (for the printed resolution of the time stamps). */
  private timeText(bytes: Uint8Array, start: number, end: number): string {
    return this.decodeLine(bytes, start, end).split(this.layout.delimiter)[this.timeSlot] ?? "";
  }

  private decodeLine(bytes: Uint8Array, start: number, end: number): string {
    return this.decoder.decode(bytes.subarray(start, end));
  }

  /** Hands the rows collected so far to the sink, unit prefix and user scale applied (value × factor, as the import always did). */
  flush(): void {
    const count = this.fill;
    if (count === 0) return;
    applyFactors(this.buffers, this.factors, count);
    this.checkRange(this.rows - count, count);
    this.fill = 0;
    this.sink.accept(this.times, this.buffers, count, this.rows - count);
  }

  /** Throws for the first value out of range among the `count` rows in the buffers (row `first` on): channels in order, then time. */
  private checkRange(first: number, count: number): void {
    for (let c = 0; c < this.buffers.length; c++) {
      const values = this.buffers[c]!;
      const bad = outOfRange(values, count);
      if (bad >= 0) throw this.tooLarge(first + bad, this.channelColumns[c]!, values[bad]!);
    }
    if (this.times && this.timeColumn) {
      const bad = outOfRange(this.times, count);
      if (bad >= 0) throw this.tooLarge(first + bad, this.timeColumn, this.times[bad]!);
    }
  }

  /** How the scanner reads this file's lines, and each channel's factor: for another thread reading part of the file the same way (parsePart). */
  scanSettings(): { scan: ScanLayout; factors: Float64Array } {
    return { scan: this.scanner.layout, factors: this.factors.slice() };
  }

  /**
   * Rows another thread read, as the scanner reads them, from the lines that follow those read so
   * far (no blank line among them): taken in as if read here, `times` (when there is a time
   * column) and `values` per channel holding `count` rows; `lastTimeText` is the time column's text
   * on the last of them.
   */
  addScannedRows(times: Float64Array | null, values: Float64Array[], count: number, lastTimeText: string): void {
    let at = 0;
    while (at < count) {
      const take = Math.min(count - at, ROW_CHUNK - this.fill);
      if (this.times && times) this.times.set(times.subarray(at, at + take), this.fill);
      for (let c = 0; c < this.buffers.length; c++) this.buffers[c]!.set(values[c]!.subarray(at, at + take), this.fill);
      this.lineNo += take;
      this.rows += take;
      this.fill += take;
      at += take;
      if (this.fill === ROW_CHUNK) this.flush();
    }
    if (count > 0 && this.times) this.lastTimeText = lastTimeText;
  }

  /**
   * A whole chunk of rows another thread read from the lines that follow (no blank line among
   * them), scaled and kept already: `decode` writes its numbers into the arrays it is given (time,
   * then channels); they are checked as {@link flush} checks them and handed to the sink's
   * `acceptKept`. The rows collected so far must fill whole chunks.
   */
  addKeptChunk(decode: (times: Float64Array | null, values: Float64Array[]) => void, lastTimeText: string): void {
    if (this.fill !== 0 || !this.sink.acceptKept) throw new Error("RowCollector.addKeptChunk: not at a chunk boundary, or the sink keeps no rows");
    decode(this.times, this.buffers);
    const first = this.rows;
    this.lineNo += ROW_CHUNK;
    this.rows += ROW_CHUNK;
    this.checkRange(first, ROW_CHUNK);
    if (this.times) this.lastTimeText = lastTimeText;
    this.sink.acceptKept(this.times, this.buffers, ROW_CHUNK, first);
  }

  /** Lines read so far, the header's and blank ones included. */
  get linesRead(): number {
    return this.lineNo;
  }

  /** A sample beyond {@link MAX_SAMPLE_MAGNITUDE} (or infinite after its unit and scale): a hard input error at its line and column. */
  private tooLarge(row: number, plan: ColumnPlan, value: number): AnalysisInputError {
    const line = this.lineOfRow(row);
    const unit = plan.role === "time" ? "s" : plan.quantity === "current" ? "A" : "V";
    const shown = Number.isFinite(value) ? `${value.toPrecision(3)} ${unit}` : `beyond the range of a number (${value})`;
    return new AnalysisInputError(
      "value-out-of-range",
      `value out of range at line ${line}, column ${plan.index + 1} (${plan.header}): ${shown} after unit and scale; ` +
        `magnitudes above ${MAX_SAMPLE_MAGNITUDE.toPrecision(1)} ${unit} overflow the sums of squares (r.m.s., power) and cannot be analysed`,
      { line, column: plan.index + 1 },
    );
  }

  /**
   * Ends the rows: flushes and checks that there are rows and
   * channels. Returns the column notes as warnings.
   */
  end(): string[] {
    this.flush();
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
    return warnings;
  }

  /** The step the last printed digit of the time stamps stands for, in seconds (after {@link end}). */
  timeResolutionS(): number {
    if (!this.timeColumn) return 0;
    return Math.max(printedResolution(this.firstTimeText), printedResolution(this.lastTimeText)) * this.timeColumn.toBase;
  }
}

/** Where the line starting at `start` ends (before "\n" or "\r\n") and where the next one starts. */
function lineEndOf(bytes: Uint8Array, start: number, end: number): { end: number; next: number } {
  let lineEnd = start;
  while (lineEnd < end && bytes[lineEnd] !== 10) lineEnd++;
  const next = lineEnd + 1;
  if (lineEnd > start && bytes[lineEnd - 1] === 13) lineEnd--;
  return { end: lineEnd, next };
}

/** Index of the first of `count` values that is not finite or beyond ±{@link MAX_SAMPLE_MAGNITUDE}, or −1. */
function outOfRange(values: Float64Array, count: number): number {
  for (let i = 0; i < count; i++) {
    const v = values[i]!;
    // Written so NaN fails too: NaN compares false both ways.
    if (!(v <= MAX_SAMPLE_MAGNITUDE && v >= -MAX_SAMPLE_MAGNITUDE)) return i;
  }
  return -1;
}

function nonNumeric(line: number, plan: ColumnPlan, cell: string): AnalysisInputError {
  const shown = cell.length > 24 ? `${cell.slice(0, 24)}…` : cell;
  // "1e400" is written as a number but lies beyond double precision: say so rather than "not a number".
  if (/^\s*[-+]?(\d+[.,]?\d*|[.,]\d+)[eE][-+]?\d+\s*$/.test(cell) && !Number.isFinite(Number(cell.replace(",", ".")))) {
    return new AnalysisInputError(
      "value-out-of-range",
      `value out of range at line ${line}, column ${plan.index + 1} (${plan.header}): "${shown}" is beyond the range of a double-precision number`,
      { line, column: plan.index + 1 },
    );
  }
  const what =
    cell.trim() === "" ? "an empty cell" : /^\s*[-+]?(inf|infinity|nan)\s*$/i.test(cell) ? `"${shown}", not a finite number` : `"${shown}", not a number`;
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
