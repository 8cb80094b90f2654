// Pass 1 of the streaming analysis on two threads: the analysis helper thread parses the later part of
// a plain file (parsePart) while this thread parses the earlier part; this thread then takes the
// helper's rows in, in file order, and runs every per-row check and sum over them itself, so every
// number and every message is the one-thread reading's.
import { open } from "node:fs/promises";
import type { AnalysisHelper } from "./analysis-helper";
import type { PartResult } from "./parse-part";
import { CHUNK_BYTES, readCsvPart, readCsvRows, readsPlainBytes, type CsvHead } from "./read-csv-rows";
import { ROW_CHUNK, type RowCollector } from "./row-collector";
import type { FirstPass } from "./stream-first-pass";

/**
 * The helper's part starts about this far into the file. This thread does the per-row work
 * (time fit, extremes, sums of squares) for every row, so the helper parses the larger part.
 */
export const HELPER_PART_FROM = 0.4;

/** Bytes searched back from a chunk's end for its last newline. */
const TAIL_BYTES = 64 * 1024;

/**
 * Where the helper's part starts: just after the last newline of the 1 MB chunk (CHUNK_BYTES) that
 * holds byte `share` × size, where reading the whole file starts a block of lines too (so both
 * ways read the same blocks). Null when that chunk is the first or the last, or has no newline in
 * its last 64 kB.
 */
async function partStart(path: string, sizeBytes: number, share: number): Promise<number | null> {
  const chunk = Math.floor((sizeBytes * share) / CHUNK_BYTES);
  const end = (chunk + 1) * CHUNK_BYTES;
  if (chunk < 1 || end >= sizeBytes) return null;
  const handle = await open(path, "r");
  try {
    const tail = new Uint8Array(TAIL_BYTES);
    const { bytesRead } = await handle.read(tail, 0, TAIL_BYTES, end - TAIL_BYTES);
    const newline = tail.subarray(0, bytesRead).lastIndexOf(10);
    return bytesRead === TAIL_BYTES && newline >= 0 ? end - TAIL_BYTES + newline + 1 : null;
  } finally {
    await handle.close();
  }
}

/**
 * Reads every line of `path` into `collector` (whose sink is `first`, keeping its rows in shared
 * memory) as {@link readCsvRows} does — the same rows, chunks, errors and line numbers — with the
 * later part parsed by `helper` meanwhile when the file is plain UTF-8 ({@link readsPlainBytes})
 * and expected to outgrow the look-ahead. This thread reads up to the helper's start, then takes
 * the helper's rows in: the rows completing its last chunk, the chunks the helper packed into the
 * kept columns (decoded for the checks, not packed again), the rows after them; and reads on
 * itself from where the helper stopped (a line its scanner cannot read, or the end). When the
 * helper's count of rows before its part differs from this thread's (blank lines, quoted fields),
 * its work is set aside and this thread reads on from the part's start.
 *
 * Complexity O(file size) on each thread; memory: 16 × ROW_CHUNK bytes per kept column besides.
 *
 * @throws AnalysisInputError as readCsvRows.
 * @example
 * await readInTwoParts("capture.csv", csvHead, collector, firstPass, helper, expectedRows > 2 * segmentSamples);
 */
export async function readInTwoParts(path: string, csvHead: CsvHead, collector: RowCollector, first: FirstPass, helper: AnalysisHelper, longRecord: boolean): Promise<void> {
  const kept = first.kept;
  const split = kept?.shared && longRecord && readsPlainBytes(csvHead.layout, csvHead.head) ? await partStart(path, csvHead.sizeBytes, HELPER_PART_FROM) : null;
  if (split === null || !kept) {
    await readCsvRows(path, csvHead.head, collector);
    return;
  }
  const { scan, factors } = collector.scanSettings();
  const columns = [...(kept.times ? [kept.times] : []), ...kept.channels];
  const edges = columns.map(() => new Float64Array(new SharedArrayBuffer(16 * ROW_CHUNK)));
  const part = helper
    .parsePart({
      path,
      from: split,
      dataStartLine: collector.layout.dataStartLine,
      scan,
      factors,
      columns: columns.map((c) => c.data),
      keepRows: first.keptRowsLimit,
      edges,
    })
    .catch((): PartResult | null => null);
  // The helper is busy parsing: mapping pages ahead would come after it is done.
  first.prefaultOff = true;
  await readCsvPart(path, collector, { to: split });
  first.prefaultOff = false;
  const done = await part;
  let resume = split;
  if (done && done.linesBefore === collector.linesRead && done.firstRow === collector.rows && first.kept === kept) {
    const rows = (at: number, count: number) => {
      const views = edges.map((e) => e.subarray(at, at + count));
      return { times: kept.times ? views[0]! : null, values: kept.times ? views.slice(1) : views };
    };
    const head = rows(0, done.headRows);
    collector.addScannedRows(head.times, head.values, done.headRows, done.lastTimeText);
    for (let k = 0; k < done.chunks; k++) {
      const from = collector.rows;
      collector.addKeptChunk((times, values) => {
        if (times) kept.times!.decode(from, from + ROW_CHUNK, times);
        kept.channels.forEach((column, c) => column.decode(from, from + ROW_CHUNK, values[c]!));
      }, done.lastTimeText);
    }
    const tail = rows(ROW_CHUNK, done.tailRows);
    collector.addScannedRows(tail.times, tail.values, done.tailRows, done.lastTimeText);
    resume = done.stop;
  }
  await readCsvPart(path, collector, { from: resume });
  collector.flush();
}
