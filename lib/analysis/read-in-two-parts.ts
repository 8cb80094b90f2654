// Pass 1 of the streaming analysis on two threads: the analysis helper thread parses the later part of
// a plain file (parsePart) while this thread parses the earlier part; this thread then takes the
// helper's rows in, in file order, and runs every per-row check and sum over them itself, so every
// number and every message is the one-thread reading's.
import type { AnalysisHelper } from "./analysis-helper";
import { helperPartStart } from "./helper-part-start";
import type { PartResult } from "./parse-part";
import { readCsvPart, readCsvRows, readsPlainBytes, type CsvHead } from "./read-csv-rows";
import { ROW_CHUNK, type RowCollector } from "./row-collector";
import type { FirstPass } from "./stream-first-pass";

/**
 * Reads every line of `path` into `collector` (whose sink is `first`, keeping its rows in shared
 * memory) as {@link readCsvRows} does — the same rows, chunks, errors and line numbers — with the
 * later part parsed by `helper` meanwhile when the file is plain UTF-8 ({@link readsPlainBytes})
 * and expected to outgrow the look-ahead. This thread reads up to the helper's start, then takes
 * the helper's rows in: the rows completing its last chunk, the whole chunks the helper wrote into
 * the kept columns (read back for the checks, not kept again), the rows after them; and reads on
 * itself from where the helper stopped (a line its scanner cannot read, or the end). When the
 * helper's count of rows before its part differs from this thread's (blank lines, quoted fields),
 * its work is set aside and this thread reads on from the part's start.
 *
 * Complexity O(file size) on each thread; memory: 16 × ROW_CHUNK bytes per kept column besides.
 *
 * @returns the rows the helper parsed (0 when it did not).
 * @throws AnalysisInputError as readCsvRows.
 * @example
 * await readInTwoParts("capture.csv", csvHead, collector, firstPass, helper, expectedRows > 2 * segmentSamples);
 */
export async function readInTwoParts(path: string, csvHead: CsvHead, collector: RowCollector, first: FirstPass, helper: AnalysisHelper, longRecord: boolean): Promise<number> {
  const kept = first.kept;
  const split = kept?.shared && longRecord && readsPlainBytes(csvHead.layout, csvHead.head) ? helperPartStart(path, csvHead.sizeBytes) : null;
  if (split === null || !kept) {
    await readCsvRows(path, csvHead.head, collector);
    return 0;
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
  let helperRows = 0;
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
    helperRows = done.headRows + done.chunks * ROW_CHUNK + done.tailRows;
  }
  await readCsvPart(path, collector, { from: resume });
  collector.flush();
  return helperRows;
}
