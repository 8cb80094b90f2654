// One column of the rows the streaming analysis keeps for its second pass, stored in fewer bytes
// where that loses nothing: most recorders print a fixed number of decimals, so a chunk of values
// is often exactly integers divided by a power of ten. Fewer bytes means fewer fresh memory pages,
// which cost more than the arithmetic that packs and unpacks them.
import { ROW_CHUNK } from "./row-collector";

/** Powers of ten that are exact doubles, for the decimals a chunk may have. */
const MAX_DECIMALS = 9;
const POW10 = Array.from({ length: MAX_DECIMALS + 1 }, (_, k) => 10 ** k);
/** Table numbers per chunk: byte offset, bytes per value (2, 4 or 8), divisor (0 for doubles). */
const ENTRY = 3;
/** The most negative integer of each width stands for −0 (a printed "-0.000"): every value comes back bit for bit. */
const MINUS_ZERO_16 = -32768;
const MINUS_ZERO_32 = -2147483648;

/** What crosses to another thread (both in shared memory when the column is shared). */
export interface CompactColumnData {
  bytes: ArrayBufferLike;
  /** {@link ENTRY} numbers per chunk of {@link ROW_CHUNK} rows. */
  table: Float64Array;
}

type ChunkView = Int16Array | Int32Array | Float64Array;

/**
 * A column of numbers kept in chunks of {@link ROW_CHUNK} rows, each stored as 16- or 32-bit
 * integers m with value = m / 10^k when every value of the chunk comes back exactly so (the same
 * double, −0 included), else as the doubles themselves. Decoding gives the stored doubles bit for
 * bit, so the analysis does not depend on how a column was kept.
 *
 * Chunks are appended in order; every chunk but the last holds exactly {@link ROW_CHUNK} rows (the
 * chunks a RowCollector hands on). A column packed into the memory of an array of doubles can be
 * unpacked into it in place ({@link CompactColumn.unpackInPlace}).
 *
 * Complexity O(1) per value to pack (two passes over a chunk) and to unpack; memory 2, 4 or 8
 * bytes per value.
 *
 * @example
 * const column = new CompactColumn(new ArrayBuffer(8 * rows), rows);
 * column.append(values, values.length); column.decode(0, values.length, out); // out equals values
 */
export class CompactColumn {
  /** Rows stored. */
  rows = 0;
  private offset = 0;
  private readonly views: (ChunkView | undefined)[] = [];

  /**
   * @param bytes where the values go: at least 8 bytes per row the column will hold.
   * @param capacityRows rows the column may hold (sizes the chunk table).
   * @param table an existing table (another thread's view of a column); else a new one, shared when `bytes` is.
   */
  constructor(
    readonly bytes: ArrayBufferLike,
    capacityRows: number,
    readonly table: Float64Array = newTable(bytes, Math.ceil(capacityRows / ROW_CHUNK) + 1),
  ) {}

  /** The column another thread reads (see {@link CompactColumn.from}). */
  get data(): CompactColumnData {
    return { bytes: this.bytes, table: this.table };
  }

  /** Another thread's view of a column (it reads only rows written before they were handed over). */
  static from(data: CompactColumnData): CompactColumn {
    return new CompactColumn(data.bytes, 0, data.table);
  }

  /**
   * Appends the first `count` values of `values` as the next chunk: packed, or (`pack` false) as
   * the doubles they are (a chunk that is likely to be unpacked again soon).
   */
  append(values: Float64Array, count: number, pack = true): void {
    const chunk = this.rows / ROW_CHUNK;
    if (!Number.isInteger(chunk)) throw new Error("CompactColumn: only the last chunk may be shorter than ROW_CHUNK rows");
    if (count === 0) return;
    // The integers m = round(v · 10^k) for the fewest decimals k at which every value comes back as
    // m / 10^k, into the scratch (one look per value; a value that needs more decimals restarts the
    // chunk with them), and the largest |m| (hence the width).
    let decimals = 0;
    let width = 8;
    while (pack) {
      const measured = toIntegers(values, count, POW10[decimals]!);
      if (measured >= 0) {
        width = measured < -MINUS_ZERO_16 ? 2 : measured < -MINUS_ZERO_32 ? 4 : 8;
        break;
      }
      const v = values[-measured - 1]!;
      do decimals++;
      while (decimals <= MAX_DECIMALS && Math.round(v * POW10[decimals]!) / POW10[decimals]! !== v);
      if (decimals > MAX_DECIMALS) break;
    }
    const offset = this.offset;
    if (offset + width * count > this.bytes.byteLength) throw new Error("CompactColumn: more rows than its memory holds");
    let view: ChunkView;
    if (width === 8) {
      view = new Float64Array(this.bytes, offset, count);
      view.set(values.subarray(0, count));
    } else if (width === 4) {
      view = new Int32Array(this.bytes, offset, count);
      view.set(scratch.subarray(0, count));
    } else {
      view = new Int16Array(this.bytes, offset, count);
      narrow(view, count);
    }
    this.table[ENTRY * chunk] = offset;
    this.table[ENTRY * chunk + 1] = width;
    this.table[ENTRY * chunk + 2] = width === 8 ? 0 : POW10[decimals]!;
    this.views[chunk] = view;
    // Chunks start on 8-byte boundaries (a chunk of doubles must).
    this.offset = offset + Math.ceil((width * count) / 8) * 8;
    this.rows += count;
  }

  /**
   * Another thread's view of a column ({@link CompactColumn.from}) set to append from chunk `chunk`
   * on, at byte 8 × chunk × ROW_CHUNK: every earlier chunk (at most 8 bytes per row) fits below it,
   * whatever its width. The column's owner takes the chunks over with {@link adopt}.
   */
  resumeAt(chunk: number): void {
    this.rows = chunk * ROW_CHUNK;
    this.offset = 8 * this.rows;
  }

  /**
   * Takes over the next chunk (`count` rows) as another thread appended it into this column's
   * memory (see {@link resumeAt}): its place and width are in the shared table.
   */
  adopt(count: number): void {
    const chunk = this.rows / ROW_CHUNK;
    if (!Number.isInteger(chunk)) throw new Error("CompactColumn: only the last chunk may be shorter than ROW_CHUNK rows");
    this.offset = this.table[ENTRY * chunk]! + Math.ceil((this.table[ENTRY * chunk + 1]! * count) / 8) * 8;
    this.views[chunk] = undefined;
    this.rows += count;
  }

  /** Bytes used so far (the packed chunks). */
  get usedBytes(): number {
    return this.offset;
  }

  /** Bytes the last chunk packed into (0 before the first). */
  get lastChunkBytes(): number {
    const chunk = Math.ceil(this.rows / ROW_CHUNK) - 1;
    return chunk < 0 ? 0 : this.offset - this.table[ENTRY * chunk]!;
  }

  /**
   * Unpacks every row, in place, into `doubles` (a view of this column's memory from its first
   * byte): row r becomes doubles[r]. Chunks are unpacked from the last to the first and each from
   * its end, so no packed value is overwritten before it is read (a chunk's doubles start at or
   * after its packed bytes). The column is spent afterwards.
   */
  unpackInPlace(doubles: Float64Array): void {
    if (doubles.buffer !== this.bytes || doubles.byteOffset !== 0) throw new Error("CompactColumn.unpackInPlace: not this column's memory");
    for (let chunk = Math.ceil(this.rows / ROW_CHUNK) - 1; chunk >= 0; chunk--) {
      const first = chunk * ROW_CHUNK;
      const count = Math.min(ROW_CHUNK, this.rows - first);
      const view = this.view(chunk);
      const divisor = this.table[ENTRY * chunk + 2]!;
      if (divisor === 0) {
        doubles.copyWithin(first, this.table[ENTRY * chunk]! / 8, this.table[ENTRY * chunk]! / 8 + count);
        continue;
      }
      const minusZero = view instanceof Int16Array ? MINUS_ZERO_16 : MINUS_ZERO_32;
      for (let i = count - 1; i >= 0; i--) {
        const m = view[i]!;
        doubles[first + i] = m === minusZero ? -0 : m / divisor;
      }
    }
    this.rows = 0;
  }

  private view(chunk: number): ChunkView {
    let view = this.views[chunk];
    if (!view) {
      const offset = this.table[ENTRY * chunk]!;
      const width = this.table[ENTRY * chunk + 1]!;
      const count = Math.min(ROW_CHUNK, (this.bytes.byteLength - offset) / width);
      view = width === 2 ? new Int16Array(this.bytes, offset, count) : width === 4 ? new Int32Array(this.bytes, offset, count) : new Float64Array(this.bytes, offset, Math.floor(count));
      this.views[chunk] = view;
    }
    return view;
  }

  /** Writes rows `from … to − 1` into `target` from index `at` on, as the doubles they were. */
  decode(from: number, to: number, target: Float64Array, at = 0): void {
    let row = from;
    while (row < to) {
      const chunk = Math.floor(row / ROW_CHUNK);
      const start = row - chunk * ROW_CHUNK;
      const end = Math.min(ROW_CHUNK, to - chunk * ROW_CHUNK);
      const view = this.view(chunk);
      const divisor = this.table[ENTRY * chunk + 2]!;
      const out = at + row - from - start;
      // One loop per width, so each reads one kind of array (a loop seeing all three is slower).
      if (divisor === 0) target.set((view as Float64Array).subarray(start, end), out + start);
      else if (view instanceof Int16Array) decode16(view, divisor, start, end, target, out);
      else decode32(view as Int32Array, divisor, start, end, target, out);
      row += end - start;
    }
  }

  /** Row `row`'s value. */
  at(row: number): number {
    const chunk = Math.floor(row / ROW_CHUNK);
    const view = this.view(chunk);
    const m = view[row - chunk * ROW_CHUNK]!;
    const divisor = this.table[ENTRY * chunk + 2]!;
    if (divisor === 0) return m;
    return m === (view instanceof Int16Array ? MINUS_ZERO_16 : MINUS_ZERO_32) ? -0 : m / divisor;
  }
}

/** The integers of the chunk being appended (one thread appends at a time per module instance). */
const scratch = new Int32Array(ROW_CHUNK);

/**
 * Writes m = round(v × scale) of the first `count` values into the scratch (−0 as MINUS_ZERO_32) and
 * returns the largest |m| (at least 2^31 when they do not fit 32 bits), or −(i + 1) for the first
 * value i that m / scale does not give back exactly (NaN included).
 */
function toIntegers(values: Float64Array, count: number, scale: number): number {
  let largest = 0;
  for (let i = 0; i < count; i++) {
    const v = values[i]!;
    const m = Math.round(v * scale);
    if (m / scale !== v) return -(i + 1);
    const magnitude = m < 0 ? -m : m;
    if (magnitude > largest) largest = magnitude;
    scratch[i] = m === 0 && 1 / v < 0 ? MINUS_ZERO_32 : m;
  }
  return largest;
}

/** The scratch's integers (all within 16 bits) into `view`, −0 re-marked. */
function narrow(view: Int16Array, count: number): void {
  for (let i = 0; i < count; i++) {
    const m = scratch[i]!;
    view[i] = m === MINUS_ZERO_32 ? MINUS_ZERO_16 : m;
  }
}

function decode16(view: Int16Array, divisor: number, start: number, end: number, target: Float64Array, out: number): void {
  for (let i = start; i < end; i++) {
    const m = view[i]!;
    target[out + i] = m === MINUS_ZERO_16 ? -0 : m / divisor;
  }
}

function decode32(view: Int32Array, divisor: number, start: number, end: number, target: Float64Array, out: number): void {
  for (let i = start; i < end; i++) {
    const m = view[i]!;
    target[out + i] = m === MINUS_ZERO_32 ? -0 : m / divisor;
  }
}

function newTable(bytes: ArrayBufferLike, entries: number): Float64Array {
  const length = ENTRY * entries;
  return typeof SharedArrayBuffer !== "undefined" && bytes instanceof SharedArrayBuffer ? new Float64Array(new SharedArrayBuffer(8 * length)) : new Float64Array(length);
}
