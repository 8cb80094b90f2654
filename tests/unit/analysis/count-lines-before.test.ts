// Counting the lines before the helper thread's part four bytes at a time (count-lines-before.ts):
// checked against counting the newline bytes one by one, on bytes chosen to trip a word-wise count
// (newlines next to 0x0b, 0x09, 0x8a, 0x00, 0x80, 0xff in every position of a word, odd lengths).
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, expect, test } from "vitest";
import { countLinesBefore } from "@/lib/analysis/count-lines-before";

const dir = mkdtempSync(join(tmpdir(), "ordwise-count-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

test("the newlines before a byte position, word-wise, equal the count byte by byte", () => {
  const pool = [10, 0x0b, 0x09, 0x8a, 0x00, 0x80, 0xff, 0x7f, 0x2c, 10];
  let seed = 7;
  const next = (): number => (seed = (seed * 1103515245 + 12345) % 2 ** 31);
  for (let trial = 0; trial < 60; trial++) {
    const bytes = Uint8Array.from({ length: 1 + (next() % 5000) }, () => pool[next() % pool.length]!);
    const path = join(dir, `bytes-${trial}.bin`); // a new file each time (counts are reused per file)
    writeFileSync(path, bytes);
    const from = 1 + (next() % bytes.length);
    const byteByByte = bytes.subarray(0, from).filter((b) => b === 10).length;
    expect(countLinesBefore(path, from), `trial ${trial}`).toBe(byteByByte);
  }
});
