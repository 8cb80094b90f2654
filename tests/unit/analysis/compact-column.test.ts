// The kept rows of the streaming analysis are packed (CompactColumn): every number must come back as
// the very double the CSV text parses to (Number(text), as the scanner reads it), −0 included,
// whatever the chunk's decimals, and the packing must take fewer bytes only where that is exact.
import { describe, expect, test } from "vitest";
import { arrayWindowSource } from "@/lib/analysis/array-window-source";
import { CompactColumn } from "@/lib/analysis/compact-column";
import { MemorySink } from "@/lib/analysis/import-csv";
import { KeptRows } from "@/lib/analysis/kept-rows";
import { ROW_CHUNK } from "@/lib/analysis/row-collector";

/** Deterministic pseudo-random numbers in [0, 1) (a linear congruential generator, common practice, no source). */
function random(seed: number): () => number {
  let state = seed;
  return () => {
    state = (state * 1103515245 + 12345) % 2147483648;
    return state / 2147483648;
  };
}

/** A chunk of numbers as a recorder prints them: `decimals` fixed decimals, parsed back by Number(). */
function printed(count: number, amplitude: number, decimals: number, seed: number): Float64Array {
  const next = random(seed);
  return Float64Array.from({ length: count }, () => Number(((next() - 0.5) * 2 * amplitude).toFixed(decimals)));
}

function sameBits(actual: Float64Array, expected: Float64Array): string[] {
  const wrong: string[] = [];
  for (let i = 0; i < expected.length; i++) if (!Object.is(actual[i], expected[i])) wrong.push(`${i}: ${actual[i]} vs ${expected[i]}`);
  return wrong.slice(0, 5);
}

function roundTrip(chunks: Float64Array[]): { decoded: Float64Array; original: Float64Array; bytes: number } {
  const rows = chunks.reduce((sum, c) => sum + c.length, 0);
  const column = new CompactColumn(new ArrayBuffer(8 * rows), rows);
  for (const chunk of chunks) column.append(chunk, chunk.length);
  const original = new Float64Array(rows);
  let at = 0;
  for (const chunk of chunks) {
    original.set(chunk, at);
    at += chunk.length;
  }
  const decoded = new Float64Array(rows);
  column.decode(0, rows, decoded);
  return { decoded, original, bytes: column.usedBytes };
}

describe("a packed column gives back every double bit for bit", () => {
  test("voltages printed with 2 decimals (±325 V) take 2 bytes a value, and \"-0.00\" comes back as −0", () => {
    const chunk = printed(ROW_CHUNK, 325, 2, 1);
    chunk[7] = Number("-0.00");
    chunk[8] = Number("0.00");
    expect(Object.is(chunk[7], -0)).toBe(true);
    const { decoded, original, bytes } = roundTrip([chunk]);
    expect(sameBits(decoded, original)).toEqual([]);
    expect(Object.is(decoded[7], -0)).toBe(true);
    expect(bytes).toBe(2 * ROW_CHUNK);
  });

  test("time stamps printed with 7 decimals up to 60 s take 4 bytes; a chunk of doubles that are no short decimals keeps 8", () => {
    const times = Float64Array.from({ length: ROW_CHUNK }, (_, k) => Number(((k + 1_000_000) / 25_600).toFixed(7)));
    const thirds = Float64Array.from({ length: ROW_CHUNK }, (_, k) => (k + 1) / 3);
    const { decoded, original, bytes } = roundTrip([times, thirds]);
    expect(sameBits(decoded, original)).toEqual([]);
    expect(bytes).toBe(4 * ROW_CHUNK + 8 * ROW_CHUNK);
  });

  test("mixed decimals in one chunk, values beyond 32-bit integers, a short last chunk and scaled values (mV → V) all come back exactly", () => {
    const mixed = printed(ROW_CHUNK, 50, 3, 2);
    for (let i = 0; i < ROW_CHUNK; i += 97) mixed[i] = Number((mixed[i]! / 7).toFixed(6));
    const large = printed(ROW_CHUNK, 3e6, 4, 3);
    const scaled = Float64Array.from(printed(1234, 900, 1, 4), (v) => v * 1e-3);
    const { decoded, original } = roundTrip([mixed, large, scaled]);
    expect(sameBits(decoded, original)).toEqual([]);
  });

  test("rows kept over a look-ahead's memory read back as they were: replayed in chunks, and unpacked in place into its doubles", async () => {
    const total = 5 * ROW_CHUNK + 999;
    const channel = printed(total, 325, 2, 5);
    channel[ROW_CHUNK + 3] = 1 / 3; // one chunk that must stay doubles
    const time = Float64Array.from({ length: total }, (_, k) => Number((k / 25_600).toFixed(7)));
    const memory = new MemorySink(1, true, total, true);
    const kept = KeptRows.over(memory);
    expect(kept.shared).toBe(true);
    for (let first = 0; first < total; first += ROW_CHUNK) {
      const end = Math.min(total, first + ROW_CHUNK);
      kept.accept(time.slice(first, end), [channel.slice(first, end)], end - first);
    }
    expect(kept.rows).toBe(total);
    // 2 bytes a value but the one chunk of doubles; the time column 4.
    expect(kept.channels[0]!.usedBytes).toBe(8 * ROW_CHUNK + 2 * (total - ROW_CHUNK) + 2);
    expect(sameBits(kept.channelRows(0, 0, total), channel)).toEqual([]);
    const replayed = { times: new Float64Array(total), channel: new Float64Array(total) };
    await kept.replay(total, {
      accept: (times: Float64Array | null, values: Float64Array[], count: number, firstRow: number) => {
        replayed.times.set(times!.subarray(0, count), firstRow);
        replayed.channel.set(values[0]!.subarray(0, count), firstRow);
      },
    });
    expect(sameBits(replayed.times, time)).toEqual([]);
    expect(sameBits(replayed.channel, channel)).toEqual([]);
    const unpacked = kept.unpackInPlace(memory);
    expect(sameBits(unpacked.times!.view(), time)).toEqual([]);
    expect(sameBits(unpacked.channels[0]!.view(), channel)).toEqual([]);
  });

  test("windows cut from kept channels (as the helper thread reads them) equal windows cut from the channels held whole, folded back at both ends", () => {
    const n = 2 * ROW_CHUNK + 500;
    const channel = printed(n, 14, 3, 6);
    const column = new CompactColumn(new SharedArrayBuffer(8 * n), n);
    for (let first = 0; first < n; first += ROW_CHUNK) column.append(channel.subarray(first, Math.min(n, first + ROW_CHUNK)), Math.min(ROW_CHUNK, n - first));
    const kept = KeptRows.windowSource([column.data], n);
    const whole = arrayWindowSource([{ samples: channel, scale: 1 }], n);
    for (const first of [-40, 0, ROW_CHUNK - 700, n - 1200, n - 300]) {
      const a = new Float64Array(1300);
      const b = new Float64Array(1300);
      kept.copyWindow(0, first, 1300, 1280, a);
      whole.copyWindow(0, first, 1300, 1280, b);
      expect(sameBits(a, b)).toEqual([]);
    }
  });
});
