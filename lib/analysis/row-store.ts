// Pass 1's parsed rows kept for pass 2 (see analyze-csv-file.ts), while they fit a memory budget:
// pass 2 then replays them instead of reading and parsing the file a second time.
import type { RowSink } from "./row-collector";

interface Chunk {
  timesS: Float64Array | null;
  values: Float64Array[];
  count: number;
  firstRow: number;
}

/**
 * A {@link RowSink} in front of another: hands every chunk on, and keeps a copy of it while the
 * copies stay within `budgetBytes`. Once the budget would be exceeded it drops them all (the
 * record is then read again), so memory never exceeds the budget whatever the record's length.
 * {@link replay} hands the kept chunks, exactly as received (same numbers, same chunking, same
 * row indices), to a second sink.
 *
 * Complexity O(samples) copying; memory ≤ `budgetBytes` (8 bytes per kept number).
 *
 * @example
 * const store = new RowStore(firstPass, 64 * 2 ** 20);
 * await readCsvRows(path, head, new RowCollector(layout, columns, store));
 * if (store.complete) await store.replay(secondPass); else await readCsvRows(path, head, new RowCollector(layout, columns, secondPass));
 */
export class RowStore implements RowSink {
  private chunks: Chunk[] | null = [];
  private bytes = 0;

  constructor(
    private readonly next: RowSink,
    private readonly budgetBytes: number,
  ) {
    if (!(budgetBytes > 0)) this.chunks = null;
  }

  accept(timesS: Float64Array | null, values: Float64Array[], count: number, firstRow: number): void {
    if (this.chunks) {
      const bytes = 8 * count * (values.length + (timesS ? 1 : 0));
      if (this.bytes + bytes > this.budgetBytes) {
        this.chunks = null;
      } else {
        this.bytes += bytes;
        this.chunks.push({ timesS: timesS ? timesS.slice(0, count) : null, values: values.map((v) => v.slice(0, count)), count, firstRow });
      }
    }
    this.next.accept(timesS, values, count, firstRow);
  }

  /** True while every chunk received so far is kept. */
  get complete(): boolean {
    return this.chunks !== null;
  }

  /**
   * Hands the kept chunks to `sink` in order, letting go of each once handed on, and lets other
   * work run between chunks (as reading the file would). Only when {@link complete}.
   */
  async replay(sink: RowSink): Promise<void> {
    const chunks = this.chunks;
    if (!chunks) throw new Error("RowStore.replay: the rows were not kept (over budget)");
    this.chunks = null;
    for (let chunk = chunks.shift(); chunk; chunk = chunks.shift()) {
      sink.accept(chunk.timesS, chunk.values, chunk.count, chunk.firstRow);
      await new Promise<void>((resolve) => setImmediate(resolve));
    }
  }
}
