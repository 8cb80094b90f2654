// Turns CSV lines into numbers in fixed-size chunks (time column and channel columns, unit
// factors applied) and hands each chunk to a sink: the in-memory import keeps them all, the
// streaming analysis looks at each chunk once. Checks and messages are the same for both.
import type { CsvLayout } from "./detect-layout";
import { AnalysisInputError } from "./errors";
import { parseNumber } from "./parse-number";
import type { ColumnPlan } from "./plan-columns";

/** Rows per chunk handed to a {@link RowSink}. */
export const ROW_CHUNK = 1 << 15;
const POW10 = Array.from({ length: 23 }, (_, k) => 10 ** k);

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
        times[this.fill] = t * timeColumn.toBase;
        if (this.rows === 0) this.firstTimeText = cell;
        this.lastTimeText = cell;
        this.lastBlock = null;
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
        times[this.fill] = t;
        if (this.rows === 0) this.firstTimeText = block.slice(lineStart, lineEnd).split(this.layout.delimiter)[timeSlot] ?? "";
        this.lastLineStart = lineStart;
        this.lastLineEnd = lineEnd;
        this.lastBlock = block;
      }
      const fill = this.fill;
      for (let c = 0; c < channelSlots.length; c++) buffers[c]![fill] = values[channelSlots[c]!]!;
      this.rows++;
      if (++this.fill === ROW_CHUNK) this.flush();
    }
  }

  /** Hands the rows collected so far to the sink, unit prefix and user scale applied (value × factor, as the import always did). */
  flush(): void {
    const count = this.fill;
    if (count === 0) return;
    const first = this.rows - count;
    for (let c = 0; c < this.buffers.length; c++) {
      const factor = this.factors[c]!;
      const values = this.buffers[c]!;
      if (factor !== 1) for (let i = 0; i < count; i++) values[i]! *= factor;
      const bad = outOfRange(values, count);
      if (bad >= 0) throw this.tooLarge(first + bad, this.channelColumns[c]!, values[bad]!);
    }
    if (this.times && this.timeColumn) {
      const bad = outOfRange(this.times, count);
      if (bad >= 0) throw this.tooLarge(first + bad, this.timeColumn, this.times[bad]!);
    }
    this.fill = 0;
    this.sink.accept(this.times, this.buffers, count, this.rows - count);
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
   * Ends the rows: flushes, cuts out the last time text and checks that there are rows and
   * channels. Returns the column notes as warnings.
   */
  end(): string[] {
    this.flush();
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
    return warnings;
  }

  /** The step the last printed digit of the time stamps stands for, in seconds (after {@link end}). */
  timeResolutionS(): number {
    if (!this.timeColumn) return 0;
    return Math.max(printedResolution(this.firstTimeText), printedResolution(this.lastTimeText)) * this.timeColumn.toBase;
  }
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
