import { createReadStream } from "node:fs";
import { open } from "node:fs/promises";
import Papa from "papaparse";
import { detectIntervalLayout, trimCells } from "./detect-interval-layout";
import { IntervalLogReader } from "./interval-log-reader";
import type { IntervalLog, IntervalMappingInput } from "./types";

const headBytes = 128 * 1024;

/** UTF-8 (with or without BOM) when the head decodes as such, else Latin-1 (older instruments). */
function encodingOf(head: Buffer): "utf8" | "latin1" {
  try {
    new TextDecoder("utf-8", { fatal: true }).decode(head, { stream: true });
    return "utf8";
  } catch {
    return "latin1";
  }
}

/**
 * Imports an interval log from a file as a stream (papaparse over a read stream): memory grows
 * with the mapped values (8 bytes each), not with the file's text. Same checks and result as
 * importIntervalLog; the delimiter and decimal separator are found once from the first 128 KB.
 *
 * @throws IntervalLogError naming line and column; a zod error for an invalid mapping.
 * @example
 * const log = await importIntervalLogFile("/tmp/log.csv", mapping);
 */
export async function importIntervalLogFile(path: string, mapping: IntervalMappingInput): Promise<IntervalLog> {
  const handle = await open(path, "r");
  let head: Buffer;
  try {
    const buffer = Buffer.alloc(headBytes);
    const { bytesRead } = await handle.read(buffer, 0, headBytes, 0);
    head = buffer.subarray(0, bytesRead);
  } finally {
    await handle.close();
  }
  const encoding = encodingOf(head);
  const headText = head.toString(encoding).replace(/^\uFEFF/, "");
  const layout = detectIntervalLayout(headText.slice(0, headText.lastIndexOf("\n") + 1) || headText);
  const reader = new IntervalLogReader(mapping, layout?.decimalSeparator ?? ".");
  let line = 0;
  await new Promise<void>((resolve, reject) => {
    const stream = createReadStream(path, { encoding, highWaterMark: 1 << 20 });
    stream.on("error", reject);
    Papa.parse<string[]>(stream as unknown as File, {
      delimiter: mapping.delimiter ?? layout?.delimiter ?? ",",
      skipEmptyLines: false,
      step: (results, parser) => {
        line += 1;
        const cells = trimCells(results.data);
        if (line === 1 && cells[0]?.charCodeAt(0) === 0xfeff) cells[0] = cells[0].slice(1).trim();
        reader.row(cells, line);
        if (reader.full) {
          parser.abort();
          stream.destroy();
          resolve();
        }
      },
      complete: () => resolve(),
      error: (error: Error) => reject(error),
    });
  });
  return reader.finish();
}
