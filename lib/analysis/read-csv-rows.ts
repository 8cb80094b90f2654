// Reads a CSV file as a stream into a RowCollector: a fast scanner for plain numeric text, papaparse
// where quotes or \r line ends need it. Never holds more than about one 1 MB chunk of text.
import { createReadStream } from "node:fs";
import { open, stat } from "node:fs/promises";
import { Transform, type Readable } from "node:stream";
import Papa from "papaparse";
import { detectEncoding, type TextEncodingName } from "./detect-encoding";
import { detectLayout, type CsvLayout } from "./detect-layout";
import { AnalysisInputError } from "./errors";
import type { RowCollector } from "./row-collector";

const HEAD_BYTES = 256 * 1024;
/** Bytes per chunk of a plain file (see byteChunks). */
export const CHUNK_BYTES = 1 << 20;

/** Part of a file, in bytes: [from, to) (from 0, to the end by default). */
export interface ByteRange {
  from?: number;
  to?: number;
}

/** The first bytes of a file, its size and the layout detected on them. */
export interface CsvHead {
  sizeBytes: number;
  head: string;
  layout: CsvLayout;
  /** Detected once from the head's bytes (also in `layout.encoding`, which the row readers use). */
  encoding: TextEncodingName;
  /** Data rows the file holds if its rows are as long as the head's (for sizing buffers; not a count). */
  estimatedRows: number;
}

/**
 * The file as UTF-8 byte chunks of about 1 MB, read into two buffers used in turn (a chunk is
 * valid until the next is asked for): the next chunk is read while this one is being scanned, and
 * fresh 1 MB buffers would cost more in page faults than the scanner spends reading them. A UTF-8
 * file is handed on as read (no decoding to text); UTF-16 and Windows-1252 are decoded by a
 * streaming TextDecoder, which carries a character split between chunks over to the next one,
 * and re-encoded as UTF-8.
 */
async function* byteChunks(path: string, encoding: TextEncodingName, range: ByteRange = {}): AsyncGenerator<Uint8Array> {
  const handle = await open(path, "r");
  const buffers = [new Uint8Array(CHUNK_BYTES), new Uint8Array(CHUNK_BYTES)];
  const to = range.to ?? Infinity;
  // Chunks end on multiples of CHUNK_BYTES wherever reading starts, so a part read on its own is cut
  // where reading the whole file would cut it.
  let position = range.from ?? 0;
  const read = (buffer: Uint8Array) => {
    const length = Math.min(CHUNK_BYTES - (position % CHUNK_BYTES), to - position);
    return length > 0 ? handle.read(buffer, 0, length, position) : Promise.resolve({ bytesRead: 0 });
  };
  let next = read(buffers[0]!);
  try {
    const decoder = encoding === "utf-8" ? null : new TextDecoder(encoding);
    const encoder = new TextEncoder();
    for (let turn = 0; ; turn ^= 1) {
      const { bytesRead } = await next;
      if (bytesRead === 0) break;
      position += bytesRead;
      const chunk = buffers[turn]!.subarray(0, bytesRead);
      // Reads follow each other (each from where the last ended); this one runs while the chunk is scanned.
      next = read(buffers[turn ^ 1]!);
      yield decoder ? encoder.encode(decoder.decode(chunk, { stream: true })) : chunk;
    }
    const rest = decoder?.decode() ?? "";
    if (rest.length > 0) yield encoder.encode(rest);
  } finally {
    // A read still under way (the reader stopped early) ends before the file is closed.
    await next.catch(() => undefined);
    await handle.close();
  }
}

/** The file as a stream of text chunks in its own encoding (for papaparse). */
function textStream(path: string, encoding: TextEncodingName): Readable {
  if (encoding === "utf-8") return createReadStream(path, { encoding: "utf8", highWaterMark: 1 << 20 });
  const decoder = new TextDecoder(encoding);
  const source = createReadStream(path, { highWaterMark: 1 << 20 });
  const decode = new Transform({
    readableObjectMode: true,
    transform(chunk: Buffer, _encoding, done) {
      done(null, decoder.decode(chunk, { stream: true }));
    },
    flush(done) {
      const rest = decoder.decode();
      done(null, rest.length > 0 ? rest : undefined);
    },
  });
  source.on("error", (error) => decode.destroy(error));
  return source.pipe(decode);
}

/**
 * Reads the head of a file (256 kB), detects its encoding ({@link detectEncoding}) and the layout on it.
 *
 * Complexity O(head); one read.
 *
 * @throws AnalysisInputError "unreadable-file", or a layout error from detectLayout.
 * @example
 * const { layout, sizeBytes } = await readCsvHead("capture.csv");
 */
export async function readCsvHead(path: string): Promise<CsvHead> {
  let sizeBytes: number;
  let head: string;
  let encoding: TextEncodingName;
  try {
    sizeBytes = (await stat(path)).size;
    const handle = await open(path, "r");
    try {
      const buffer = Buffer.alloc(Math.min(sizeBytes, HEAD_BYTES));
      const { bytesRead } = await handle.read(buffer, 0, buffer.length, 0);
      encoding = detectEncoding(buffer.subarray(0, bytesRead));
      // TextDecoder drops the byte-order mark.
      head = new TextDecoder(encoding).decode(buffer.subarray(0, bytesRead));
    } finally {
      await handle.close();
    }
  } catch (error) {
    const reason = error instanceof Error && "code" in error ? String((error as NodeJS.ErrnoException).code) : "read error";
    throw new AnalysisInputError("unreadable-file", `cannot read file ${path}: ${reason}`);
  }
  const layout = detectLayout(head, sizeBytes <= HEAD_BYTES);
  layout.encoding = encoding;
  const sampleLines = head.split(layout.newline).slice(layout.dataStartLine - 1, -1);
  const bytesPerRow = sampleLines.length > 0 ? sampleLines.reduce((sum, l) => sum + l.length + layout.newline.length, 0) / sampleLines.length : 64;
  return { sizeBytes, head, layout, encoding, estimatedRows: sizeBytes / bytesPerRow };
}

/**
 * Streams a file whose head is plain (no quotes) as UTF-8 bytes: complete lines of each 1 MB chunk
 * go through the fast scanner; from a line with a quote on, the rest of the chunk is decoded and
 * goes through papaparse, which handles quoting.
 */
async function readPlain(path: string, collector: RowCollector, range: ByteRange = {}): Promise<void> {
  const utf8 = new TextDecoder("utf-8", { ignoreBOM: true });
  /** The start of a line cut by the end of the previous chunk. */
  let partial: Uint8Array = new Uint8Array(0);
  let first = (range.from ?? 0) === 0;
  const consume = (block: Uint8Array, start: number, end: number): void => {
    // The scanner reads up to the first line with a quote; papaparse takes the rest of the block.
    const quoted = collector.addPlainBytes(block, start, end);
    if (quoted >= end) return;
    const text = utf8.decode(block.subarray(quoted, end));
    const rows = Papa.parse<string[]>(text, { delimiter: collector.layout.delimiter, newline: "\n" }).data;
    // papaparse yields a last empty row for the final newline of the block; addRows counts it as a line otherwise.
    if (text.endsWith("\n")) rows.pop();
    collector.addRows(rows.map((r) => r.map((f) => f.replace(/\r$/, ""))));
  };
  try {
    for await (const chunk of byteChunks(path, collector.layout.encoding ?? "utf-8", range)) {
      let start = 0;
      // A UTF-8 byte-order mark (decoded encodings have lost theirs).
      if (first && chunk[0] === 0xef && chunk[1] === 0xbb && chunk[2] === 0xbf) start = 3;
      first = false;
      const firstEnd = chunk.indexOf(10, start);
      if (firstEnd < 0) {
        partial = join(partial, chunk.subarray(start));
        continue;
      }
      // The line the previous chunk cut, completed by this one's first line.
      if (partial.length > 0) {
        const line = join(partial, chunk.subarray(start, firstEnd + 1));
        consume(line, 0, line.length);
        start = firstEnd + 1;
      }
      const cut = chunk.lastIndexOf(10) + 1;
      consume(chunk, start, cut);
      partial = chunk.slice(cut);
    }
  } catch (error) {
    if (error instanceof AnalysisInputError) throw error;
    throw new AnalysisInputError("unreadable-file", `cannot read file ${path}: ${error instanceof Error ? error.message : String(error)}`);
  }
  if (partial.length > 0) consume(partial, 0, partial.length);
}

function join(a: Uint8Array, b: Uint8Array): Uint8Array {
  if (a.length === 0) return b.slice();
  const joined = new Uint8Array(a.length + b.length);
  joined.set(a);
  joined.set(b, a.length);
  return joined;
}

/** Streams a file with quotes or \r line ends through papaparse. */
function readQuoted(path: string, collector: RowCollector): Promise<void> {
  const { layout } = collector;
  return new Promise<void>((resolve, reject) => {
    const stream = textStream(path, layout.encoding ?? "utf-8");
    let failed = false;
    const fail = (error: unknown): void => {
      if (failed) return;
      failed = true;
      stream.destroy();
      reject(error);
    };
    stream.on("error", (error) => fail(new AnalysisInputError("unreadable-file", `cannot read file ${path}: ${error.message}`)));
    Papa.parse<string[]>(stream as unknown as File, {
      delimiter: layout.delimiter,
      newline: layout.newline,
      beforeFirstChunk: (chunk) => (chunk.charCodeAt(0) === 0xfeff ? chunk.slice(1) : chunk),
      chunk: (results, parser) => {
        if (failed) return;
        try {
          collector.addRows(results.data);
        } catch (error) {
          fail(error); // before abort(): abort() calls complete synchronously
          parser.abort();
        }
      },
      complete: () => {
        if (!failed) resolve();
      },
      error: (error: Error) => fail(new AnalysisInputError("unreadable-file", `cannot read file ${path}: ${error.message}`)),
    });
  });
}

/**
 * Streams every line of a file into `collector` (1 MB chunks), then ends the collector's rows
 * (the last chunk reaches its sink). Call it again with a fresh collector for a second pass.
 *
 * Complexity O(file size); memory: one text chunk plus the collector's row chunk.
 *
 * @param head the file's head as read by {@link readCsvHead} (decides plain or quoted reading).
 * @throws AnalysisInputError for unreadable files and every row error the collector finds.
 * @example
 * await readCsvRows("capture.csv", head, new RowCollector(head.layout, columns, sink));
 */
export async function readCsvRows(path: string, head: string, collector: RowCollector): Promise<void> {
  if (collector.layout.newline !== "\r" && !head.includes('"')) await readPlain(path, collector);
  else await readQuoted(path, collector);
  collector.flush();
}

/**
 * Whether {@link readCsvRows} reads the file's bytes as they are (UTF-8, no quotes in its head, "\n"
 * line ends), so parts of it can be read on their own ({@link readCsvPart}).
 */
export function readsPlainBytes(layout: CsvLayout, head: string): boolean {
  return layout.newline !== "\r" && !head.includes('"') && (layout.encoding ?? "utf-8") === "utf-8";
}

/**
 * Reads bytes [from, to) of a plain file ({@link readsPlain}) into `collector` as {@link readCsvRows}
 * reads them within the whole file (the same chunks, hence the same lines through the same
 * parser), without flushing the last rows: `from` must be 0 or the start of a line at which reading
 * the whole file would start a block (see splitPoint), `to` the end of the file or such a start.
 *
 * @throws AnalysisInputError as readCsvRows.
 * @example
 * await readCsvPart("capture.csv", collector, { to: split });
 */
export async function readCsvPart(path: string, collector: RowCollector, range: ByteRange): Promise<void> {
  await readPlain(path, collector, range);
}
