// Where the analysis helper thread's part of a file starts when pass 1 is read in two parts (see
// read-in-two-parts.ts).
import { closeSync, openSync, readSync } from "node:fs";
import { CHUNK_BYTES } from "./read-csv-rows";

/**
 * The helper's part starts about half-way into the file. The main thread also does the per-row
 * work (time fit, extremes, sums of squares) for the helper's rows, but the helper then measures the
 * frequency segments: measured on the 60 s capture, 0.5 beat 0.3, 0.4 and 0.6 (by a few per cent).
 */
export const HELPER_PART_FROM = 0.5;

/** Bytes searched back from a chunk's end for its last newline. */
const TAIL_BYTES = 64 * 1024;

/**
 * Where the helper's part starts: just after the last newline of the 1 MB chunk (CHUNK_BYTES) that
 * holds byte `share` × size — where reading the whole file starts a block of lines too, so both
 * ways read the same blocks. Null when that chunk is the first or the last, or has no newline in
 * its last 64 kB. (Synchronous: one small read, also in the helper thread before it is asked.)
 *
 * Complexity O(1): one 64 kB read.
 *
 * @example
 * helperPartStart("capture.csv", sizeBytes) // e.g. 24117213 of 60272399 bytes
 */
export function helperPartStart(path: string, sizeBytes: number, share = HELPER_PART_FROM): number | null {
  const chunk = Math.floor((sizeBytes * share) / CHUNK_BYTES);
  const end = (chunk + 1) * CHUNK_BYTES;
  if (chunk < 1 || end >= sizeBytes) return null;
  const fd = openSync(path, "r");
  try {
    const tail = new Uint8Array(TAIL_BYTES);
    const bytesRead = readSync(fd, tail, 0, TAIL_BYTES, end - TAIL_BYTES);
    const newline = tail.subarray(0, bytesRead).lastIndexOf(10);
    return bytesRead === TAIL_BYTES && newline >= 0 ? end - TAIL_BYTES + newline + 1 : null;
  } finally {
    closeSync(fd);
  }
}
