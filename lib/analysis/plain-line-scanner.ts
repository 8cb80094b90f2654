// The fast path of CSV reading: plain numeric lines read straight from their UTF-8 bytes into
// Float64Arrays, without text, per-row arrays or substrings. RowCollector drives it and sends every
// line it cannot read exactly through its general (string) path, so checks and messages are one.

const POW10 = Array.from({ length: 23 }, (_, k) => 10 ** k);

/** Where a file's fields go: column indices and the time column's unit factor. */
export interface ScanLayout {
  columnCount: number;
  delimiterCode: number;
  /** 46 "." or 44 "," (decimal comma). */
  decimalCode: number;
  /** The file column of each channel buffer. */
  channelSlots: Int32Array;
  timeSlot: number;
  timeToBase: number;
}

/**
 * Reads consecutive plain numeric lines of UTF-8 bytes: each field an optional sign, up to 15
 * digits with an optional decimal mark and an optional exponent, parsed as one correctly rounded
 * operation on exact operands (the same double as `Number(text)`). Stops at the first line it
 * cannot read exactly — blank, whitespace, text, quotes, fewer fields than the header, other
 * number forms — and leaves it to the caller. Digits, signs, marks, delimiters and line ends are
 * single bytes in UTF-8, so no decoding is needed.
 *
 * Kept apart from the cold paths (flushing, error messages) so the optimising compiler sees only
 * this loop: it then compiles once, early, and is not thrown out when a rare branch is first taken.
 *
 * Complexity O(bytes); no allocation.
 *
 * @example
 * const scanner = new PlainLineScanner(layout, [new Float64Array(4)], null);
 * scanner.scan(new TextEncoder().encode("1,2\n3,4\n"), 0, 8, 0, 4) // 2 rows; scanner.pos === 8
 */
export class PlainLineScanner {
  /**
   * After {@link scan}: where it stopped — at or past `end`, after `maxRows` rows, or else at the
   * start of a line it could not read.
   */
  pos = 0;
  /** After {@link scan}: the start and end (before "\n" or "\r\n") of the last line it read (unchanged when none). */
  lastLineStart = -1;
  lastLineEnd = -1;
  private readonly fields: Float64Array;

  constructor(
    readonly layout: ScanLayout,
    /** Channel buffers, written at the row slots `fill …`. */
    private readonly buffers: Float64Array[],
    private readonly times: Float64Array | null,
  ) {
    this.fields = new Float64Array(layout.columnCount);
  }

  /**
   * Reads lines of `bytes[pos..end)` into the buffers from slot `fill` on, at most `maxRows`.
   * Returns the number of rows read; {@link pos} and the last line say where it stopped.
   *
   * `bytes[end − 1]` must be a newline: every field then ends at or before it, so no byte is
   * read past `end` and none needs checking against it (RowCollector.addPlainBytes sees to it).
   *
   * The results are stored on every row rather than once after the loop: a store the optimised
   * loop has never seen executed would throw its code out at every return.
   */
  scan(bytes: Uint8Array, pos: number, end: number, fill: number, maxRows: number): number {
    const { columnCount, delimiterCode, decimalCode, channelSlots, timeSlot, timeToBase } = this.layout;
    const { fields, buffers, times } = this;
    const channels = channelSlots.length;
    let rows = 0;
    this.pos = pos;
    if (end > pos && bytes[end - 1] !== 10) throw new Error("PlainLineScanner.scan: the bytes must end with a newline");
    while (pos < end && rows < maxRows) {
      let field = 0;
      let i = pos;
      let lineEnd = -1;
      let ok = true;
      while (field < columnCount) {
        let negative = false;
        let c = bytes[i]!;
        if (c === 45 || c === 43) {
          negative = c === 45;
          c = bytes[++i]!;
        }
        let mantissa = 0;
        let digits = 0;
        let scale = 0;
        while (c >= 48 && c <= 57) {
          mantissa = mantissa * 10 + (c - 48);
          digits++;
          c = bytes[++i]!;
        }
        if (c === decimalCode) {
          c = bytes[++i]!;
          while (c >= 48 && c <= 57) {
            mantissa = mantissa * 10 + (c - 48);
            digits++;
            scale--;
            c = bytes[++i]!;
          }
        }
        if (digits === 0 || digits > 15) {
          ok = false;
          break;
        }
        if (c === 101 || c === 69) {
          c = bytes[++i]!;
          let expNegative = false;
          if (c === 45 || c === 43) {
            expNegative = c === 45;
            c = bytes[++i]!;
          }
          let exponent = 0;
          let expDigits = 0;
          while (c >= 48 && c <= 57 && expDigits < 4) {
            exponent = exponent * 10 + (c - 48);
            expDigits++;
            c = bytes[++i]!;
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
        const magnitude = scale < 0 ? mantissa / POW10[-scale]! : mantissa * POW10[scale]!;
        fields[field++] = negative ? -magnitude : magnitude;
        // The line ends here: "\n" or "\r\n".
        if (c === 10 || (c === 13 && bytes[i + 1] === 10)) {
          lineEnd = i;
          break;
        }
        if (c !== delimiterCode) {
          ok = false;
          break;
        }
        i++;
      }
      if (!ok || field < columnCount) break;
      let next: number;
      if (lineEnd >= 0) {
        next = lineEnd + (i < end && bytes[i] === 13 ? 2 : 1);
      } else {
        // Fields beyond the header's columns (addRows accepts any extra): the line goes on to its end.
        let j = i;
        while (j < end && bytes[j] !== 10) j++;
        next = j + 1;
        lineEnd = j > i && bytes[j - 1] === 13 ? j - 1 : j;
      }
      const slot = fill + rows;
      if (times) times[slot] = fields[timeSlot]! * timeToBase;
      for (let c = 0; c < channels; c++) buffers[c]![slot] = fields[channelSlots[c]!]!;
      rows++;
      this.lastLineStart = pos;
      this.lastLineEnd = lineEnd;
      pos = next;
      this.pos = pos;
    }
    return rows;
  }
}
