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

/** The first bytes of a file, its size and the layout detected on them. */
export interface CsvHead {
  sizeBytes: number;
  head: string;
  layout: CsvLayout;
  /** Detected once from the head's bytes (also in `layout.encoding`, which the row readers use). */
  encoding: TextEncodingName;
}

/**
 * The file as a stream of text chunks in its own encoding. UTF-8 takes Node's own decoder (the
 * fast path of large captures); UTF-16 and Windows-1252 go through a streaming TextDecoder, which
 * carries a character split between chunks over to the next one.
 */
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
  return { sizeBytes, head, layout, encoding };
}

/**
 * Streams a file whose head is plain (no quotes): complete lines of each 1 MB chunk go through the
 * fast scanner; a chunk that does contain quotes goes through papaparse, which handles quoting.
 */
async function readPlain(path: string, collector: RowCollector): Promise<void> {
  const stream = textStream(path, collector.layout.encoding ?? "utf-8");
  let partial = "";
  let first = true;
  const consume = (block: string): void => {
    if (block.includes('"')) {
      const rows = Papa.parse<string[]>(block, { delimiter: collector.layout.delimiter, newline: "\n" }).data;
      // papaparse yields a last empty row for the final newline of the block; addRows counts it as a line otherwise.
      if (block.endsWith("\n")) rows.pop();
      collector.addRows(rows.map((r) => r.map((f) => f.replace(/\r$/, ""))));
    } else {
      collector.addPlainLines(block);
    }
  };
  try {
    for await (const chunk of stream as AsyncIterable<string>) {
      let text = partial + chunk;
      if (first && text.charCodeAt(0) === 0xfeff) text = text.slice(1);
      first = false;
      const cut = text.lastIndexOf("\n");
      if (cut < 0) {
        partial = text;
        continue;
      }
      partial = text.slice(cut + 1);
      consume(text.slice(0, cut + 1));
    }
  } catch (error) {
    stream.destroy();
    if (error instanceof AnalysisInputError) throw error;
    throw new AnalysisInputError("unreadable-file", `cannot read file ${path}: ${error instanceof Error ? error.message : String(error)}`);
  }
  if (partial.length > 0) consume(partial);
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
