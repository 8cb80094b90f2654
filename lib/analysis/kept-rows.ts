// The rows pass 1 of the streaming analysis keeps for pass 2 (see analyze-csv-file.ts), packed
// column by column (CompactColumn) into the memory the look-ahead already mapped.
import { CompactColumn, type CompactColumnData } from "./compact-column";
import type { MemorySink } from "./import-csv";
import type { SampleBuffer } from "./sample-buffer";
import { ROW_CHUNK, type RowSink } from "./row-collector";
import type { WindowSource } from "./window-analyzer";

/**
 * The time column (when there is one) and every channel of the rows kept so far, each a
 * {@link CompactColumn}: the same doubles back, in fewer bytes where a column prints a fixed
 * number of decimals. In shared memory when the analysis helper thread is to read them.
 *
 * Complexity O(1) per value kept or read back.
 *
 * @example
 * const kept = KeptRows.over(lookAhead); kept.accept(times, values, count);
 * await kept.replay(rows, secondPass);
 */
export class KeptRows {
  private constructor(
    readonly times: CompactColumn | null,
    readonly channels: CompactColumn[],
    /** The columns are in SharedArrayBuffers (the helper thread can read them). */
    readonly shared: boolean,
  ) {}

  /**
   * Keeps rows packed in the memory of `memory`'s arrays (which must have room for 8 bytes per row
   * to be kept), from its first byte on; shared when its arrays are.
   */
  static over(memory: MemorySink): KeptRows {
    const over = (buffer: SampleBuffer): CompactColumn => new CompactColumn(buffer.storage().buffer, buffer.storage().length);
    return new KeptRows(memory.times ? over(memory.times) : null, memory.channels.map(over), memory.channels[0]?.shared ?? false);
  }

  /**
   * Unpacks every row into the doubles of `memory` (the sink the rows were kept over, see
   * {@link KeptRows.over}), in place, and returns it holding them: for the in-memory analysis.
   */
  unpackInPlace(memory: MemorySink): MemorySink {
    const rows = this.rows;
    const unpack = (column: CompactColumn, buffer: SampleBuffer): void => {
      column.unpackInPlace(buffer.storage());
      buffer.length = rows;
    };
    if (this.times && memory.times) unpack(this.times, memory.times);
    this.channels.forEach((column, c) => unpack(column, memory.channels[c]!));
    return memory;
  }

  /** Calls `visit` for the time column (when there is one), then for each channel (`index` counts them all). */
  forEachColumn(visit: (column: CompactColumn, index: number) => void): void {
    [...(this.times ? [this.times] : []), ...this.channels].forEach(visit);
  }

  /** Rows kept. */
  get rows(): number {
    return this.channels[0]?.rows ?? this.times?.rows ?? 0;
  }

  /**
   * Keeps the next chunk of rows (every chunk but the last holds ROW_CHUNK rows), packed or
   * (`pack` false) as doubles.
   */
  accept(timesS: Float64Array | null, values: Float64Array[], count: number, pack = true): void {
    if (this.times && timesS) this.times.append(timesS, count, pack);
    for (let c = 0; c < values.length; c++) this.channels[c]!.append(values[c]!, count, pack);
  }

  /** Takes over the next chunk of `count` rows, packed into the columns by another thread (CompactColumn.adopt). */
  adopt(count: number): void {
    this.times?.adopt(count);
    for (const column of this.channels) column.adopt(count);
  }

  /**
   * Hands the `rows` kept rows to `sink` in the chunks a RowCollector reading the file would give
   * ({@link ROW_CHUNK} rows, the last one shorter; same row indices), unpacked into arrays reused
   * from chunk to chunk, and lets other work run between chunks (as reading the file would).
   */
  async replay(rows: number, sink: RowSink): Promise<void> {
    if (this.rows !== rows) throw new Error(`KeptRows.replay: ${rows} rows expected, ${this.rows} kept`);
    const times = this.times ? new Float64Array(ROW_CHUNK) : null;
    const channels = this.channels.map(() => new Float64Array(ROW_CHUNK));
    for (let first = 0; first < rows; first += ROW_CHUNK) {
      const end = Math.min(rows, first + ROW_CHUNK);
      if (times) this.times!.decode(first, end, times);
      this.channels.forEach((column, c) => column.decode(first, end, channels[c]!));
      sink.accept(times, channels, end - first, first);
      await new Promise<void>((resolve) => setImmediate(resolve));
    }
  }

  /** Rows `from … to − 1` of channel `c`, unpacked. */
  channelRows(c: number, from: number, to: number): Float64Array {
    const out = new Float64Array(to - from);
    this.channels[c]!.decode(from, to, out);
    return out;
  }

  /**
   * A {@link WindowSource} over kept channels as another thread sees them ({@link CompactColumn.data}):
   * indices before the record's start or past its end (`n` samples) are folded back by the
   * window's period, as arrayWindowSource does for channels held whole.
   *
   * @example
   * const source = KeptRows.windowSource(kept.channels.map((c) => c.data), n);
   */
  static windowSource(channels: readonly CompactColumnData[], n: number): WindowSource {
    const columns = channels.map((data) => CompactColumn.from(data));
    return {
      copyWindow(ci, first, span, period, target) {
        const column = columns[ci]!;
        // Inside the record the window is one run of rows; only its ends may fold back.
        const inFrom = Math.min(span, Math.max(0, -first));
        const inTo = Math.max(inFrom, Math.min(span, n - first));
        if (inFrom < inTo) column.decode(first + inFrom, first + inTo, target, inFrom);
        for (let k = 0; k < span; k++) {
          if (k === inFrom && inFrom < inTo) {
            k = inTo - 1;
            continue;
          }
          let j = first + k;
          while (j < 0) j += period;
          while (j >= n) j -= period;
          if (j < 0) j = 0;
          target[k] = column.at(j);
        }
      },
    };
  }
}
