// Counting a file's lines before the analysis helper thread's part (parse-part.ts), possibly ahead of
// time: the command line has the helper count them while the main thread is still starting up.
import { closeSync, openSync, readSync, statSync } from "node:fs";
import { helperPartStart } from "./helper-part-start";

const READ_BYTES = 1 << 20;

/** The last count, kept for the part it was made for. */
let counted: { path: string; sizeBytes: number; mtimeMs: number; from: number; lines: number } | null = null;

/**
 * Newlines in bytes [0, from) of `path` (`from` defaults to where the helper's part would start,
 * helperPartStart; null when there is no such part or the file cannot be read). A count made
 * earlier for the same file, size, modification time and `from` is reused; the caller checks the
 * count against the lines it read itself either way.
 *
 * Complexity O(from): reads and scans the bytes once.
 *
 * @example
 * countLinesBefore("capture.csv") // counted ahead; countLinesBefore("capture.csv", 24117213) then answers at once
 */
export function countLinesBefore(path: string, from?: number): number | null {
  let stats;
  try {
    stats = statSync(path);
  } catch {
    return null;
  }
  const { size: sizeBytes, mtimeMs } = stats;
  const start = from ?? helperPartStart(path, sizeBytes);
  if (start === null) return null;
  if (counted && counted.path === path && counted.sizeBytes === sizeBytes && counted.mtimeMs === mtimeMs && counted.from === start) return counted.lines;
  const fd = openSync(path, "r");
  let lines = 0;
  try {
    const buffer = new Uint8Array(READ_BYTES);
    const words = new Int32Array(buffer.buffer);
    for (let position = 0; position < start; ) {
      const read = readSync(fd, buffer, 0, Math.min(READ_BYTES, start - position), position);
      if (read === 0) break;
      lines += newlinesIn(words, read >> 2);
      for (let i = read & ~3; i < read; i++) if (buffer[i] === 10) lines++;
      position += read;
    }
  } finally {
    closeSync(fd);
  }
  counted = { path, sizeBytes, mtimeMs, from: start, lines };
  return lines;
}

/**
 * Newline bytes in the first `count` words, four bytes at a time: a byte equal to 10 becomes zero
 * after the exclusive or, and the zero bytes of a word are marked exactly (no carry crosses a byte)
 * and counted with one multiplication.
 */
function newlinesIn(words: Int32Array, count: number): number {
  let lines = 0;
  for (let i = 0; i < count; i++) {
    const x = words[i]! ^ 0x0a0a0a0a;
    const zero = ~((((x & 0x7f7f7f7f) + 0x7f7f7f7f) | x) | 0x7f7f7f7f);
    lines += Math.imul((zero >>> 7) & 0x01010101, 0x01010101) >>> 24;
  }
  return lines;
}
