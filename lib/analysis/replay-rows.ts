// Pass 2 of the streaming analysis from the rows pass 1 kept (see analyze-csv-file.ts), instead of
// reading and parsing the file a second time.
import type { MemorySink } from "./import-csv";
import { ROW_CHUNK, type RowSink } from "./row-collector";

/**
 * Hands `rows` kept rows to `sink` in the chunks a {@link RowCollector} reading the file would
 * give ({@link ROW_CHUNK} rows, the last one shorter; same row indices), as views on the kept
 * arrays, and lets other work run between chunks (as reading the file would).
 *
 * Complexity O(chunks); no copying.
 *
 * @example
 * await replayRows(first.kept, collector.rows, secondPass);
 */
export async function replayRows(kept: MemorySink, rows: number, sink: RowSink): Promise<void> {
  const times = kept.times?.view() ?? null;
  const channels = kept.channels.map((c) => c.view());
  if ((times && times.length !== rows) || channels.some((c) => c.length !== rows)) throw new Error(`replayRows: ${rows} rows expected`);
  for (let first = 0; first < rows; first += ROW_CHUNK) {
    const end = Math.min(rows, first + ROW_CHUNK);
    sink.accept(
      times ? times.subarray(first, end) : null,
      channels.map((c) => c.subarray(first, end)),
      end - first,
      first,
    );
    await new Promise<void>((resolve) => setImmediate(resolve));
  }
}
