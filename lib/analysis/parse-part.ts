// The analysis helper thread's share of pass 1 (see read-in-two-parts.ts): the later part of a plain
// file parsed by the same scanner the main thread uses, its chunks scaled and packed straight into
// the kept columns, so the main thread only runs the per-row accumulations over them, in order.
import { closeSync, openSync, readSync } from "node:fs";
import { CompactColumn, type CompactColumnData } from "./compact-column";
import { countLinesBefore } from "./count-lines-before";
import { PlainLineScanner, type ScanLayout } from "./plain-line-scanner";
import { applyFactors, ROW_CHUNK } from "./row-collector";

/** Bytes read at a time. */
const READ_BYTES = 1 << 20;

/** What the main thread asks the helper to parse (all arrays in shared memory). */
export interface PartRequest {
  path: string;
  /** The part starts here (the start of a line, after the header) and runs to the end of the file. */
  from: number;
  /** The file's first data line (1-based): lines before it are not rows. */
  dataStartLine: number;
  scan: ScanLayout;
  /** Per channel, the unit prefix times the user's scale (RowCollector's factors). */
  factors: Float64Array;
  /** The kept columns, the time column first when there is one. */
  columns: CompactColumnData[];
  /** Rows the kept columns may hold (a chunk past them is left to the main thread). */
  keepRows: number;
  /**
   * Per kept column, room for 2 × ROW_CHUNK rows as the scanner reads them (unit and scale not yet
   * applied): the rows before the first whole chunk, then those after the last.
   */
  edges: Float64Array[];
}

/** Where the helper's rows are (see {@link parsePart}). */
export interface PartResult {
  /** Lines before `from` (header included). */
  linesBefore: number;
  /** The part's first row, if every line before it is a row after the header (the main thread checks). */
  firstRow: number;
  /** Rows in `edges` [0, headRows): they complete the main thread's last chunk. */
  headRows: number;
  /** Whole chunks packed into the columns, from chunk ceil(firstRow / ROW_CHUNK) on. */
  chunks: number;
  /** Rows in `edges` [ROW_CHUNK, ROW_CHUNK + tailRows): read after the whole chunks, not written to the columns. */
  tailRows: number;
  /** The byte it stopped at: the file's end, or the start of a line the scanner cannot read (or not ended by a newline). */
  stop: number;
  /** The time column's text on the last line it read ("" when none). */
  lastTimeText: string;
  ms: number;
}

/**
 * Parses a plain file from `from` to its end with {@link PlainLineScanner}, stopping at the first line
 * it cannot read (the main thread reads on from there with its full reader, so every error and
 * message is its own). Counts the lines before `from` (countLinesBefore, perhaps counted ahead) to place its rows: whole chunks of
 * ROW_CHUNK rows are scaled as RowCollector.flush scales them (applyFactors) and packed into the kept columns
 * (CompactColumn.resumeAt); the rows before the first whole chunk and after the last go to `edges`
 * as read.
 *
 * Complexity O(file size): counting the newlines before `from` (unless counted ahead), scanning the bytes after.
 *
 * @example
 * const result = parsePart(request); // in the helper thread
 */
export function parsePart(request: PartRequest): PartResult {
  const started = performance.now();
  const { path, from, scan, factors, edges, keepRows } = request;
  const hasTime = request.columns.length > factors.length;
  const fd = openSync(path, "r");
  try {
    const buffer = new Uint8Array(2 * READ_BYTES);
    const linesBefore = countLinesBefore(path, from) ?? 0;
    const firstRow = linesBefore - (request.dataStartLine - 1);
    const result: PartResult = { linesBefore, firstRow, headRows: 0, chunks: 0, tailRows: 0, stop: from, lastTimeText: "", ms: 0 };
    if (firstRow <= 0) return result;

    const times = hasTime ? new Float64Array(ROW_CHUNK) : null;
    const channels = Array.from(factors, () => new Float64Array(ROW_CHUNK));
    const scanner = new PlainLineScanner(scan, channels, times);
    const columns = request.columns.map((data) => CompactColumn.from(data));
    let chunk = Math.ceil(firstRow / ROW_CHUNK);
    for (const column of columns) column.resumeAt(chunk);
    const decoder = new TextDecoder("utf-8", { ignoreBOM: true });
    let head = true;
    let target = chunk * ROW_CHUNK - firstRow;
    let fill = 0;
    /** Copies the rows read so far to the edges (at `at`) as they are. */
    const toEdges = (at: number): void => {
      if (times) edges[0]!.set(times.subarray(0, fill), at);
      channels.forEach((values, c) => edges[c + (times ? 1 : 0)]!.set(values.subarray(0, fill), at));
    };
    /** A full chunk (or the head): written, or when the kept rows end there, left as the tail. Returns false to stop. */
    const complete = (): boolean => {
      if (head) {
        toEdges(0);
        result.headRows = fill;
        head = false;
      } else if ((chunk + 1) * ROW_CHUNK > keepRows) {
        return false;
      } else {
        applyFactors(channels, factors, ROW_CHUNK);
        // Packed as the main thread packs its own: fresh memory pages cost this thread more than the
        // packing (measured: ~18 µs a page here, 133 ms for the 60 s capture's part as doubles).
        if (times) columns[0]!.append(times, ROW_CHUNK);
        channels.forEach((values, c) => columns[c + (times ? 1 : 0)]!.append(values, ROW_CHUNK));
        result.chunks++;
        chunk++;
      }
      fill = 0;
      target = ROW_CHUNK;
      return true;
    };

    let position = from;
    let held = 0;
    for (;;) {
      const read = readSync(fd, buffer, held, READ_BYTES, position);
      position += read;
      const length = held + read;
      // Whole lines only: a last line without a newline (or one longer than the buffer) is left to the main thread.
      const cut = read === 0 ? 0 : buffer.lastIndexOf(10, length - 1) + 1;
      let pos = 0;
      let stopped = read === 0 || cut === 0;
      while (!stopped && pos < cut) {
        if (fill === target && !complete()) {
          stopped = true;
          break;
        }
        const room = target - fill;
        const rows = scanner.scan(buffer, pos, cut, fill, room);
        if (rows > 0) {
          fill += rows;
          const line = decoder.decode(buffer.subarray(scanner.lastLineStart, scanner.lastLineEnd));
          result.lastTimeText = line.split(String.fromCharCode(scan.delimiterCode))[scan.timeSlot] ?? "";
        }
        pos = scanner.pos;
        // Stopped before the end with room left: a line the scanner cannot read.
        if (pos < cut && rows < room) stopped = true;
      }
      // buffer[0] is the file's byte position − length.
      result.stop = position - length + pos;
      if (stopped) break;
      buffer.copyWithin(0, cut, length);
      held = length - cut;
    }
    // A last chunk filled exactly at the end is written too (it could equally go to the main thread as the tail).
    if (!head && fill === ROW_CHUNK && result.stop === position) complete();
    // The rows read since the last whole chunk.
    if (head) {
      toEdges(0);
      result.headRows = fill;
    } else {
      toEdges(ROW_CHUNK);
      result.tailRows = fill;
    }
    result.ms = performance.now() - started;
    return result;
  } finally {
    closeSync(fd);
  }
}
