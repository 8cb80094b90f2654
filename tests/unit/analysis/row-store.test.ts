// Pass 1's rows kept for pass 2 within a memory budget (lib/analysis/row-store.ts).
import { expect, test } from "vitest";
import { RowStore } from "@/lib/analysis/row-store";
import type { RowSink } from "@/lib/analysis/row-collector";

interface Seen {
  times: number[] | null;
  values: number[][];
  count: number;
  firstRow: number;
}

function recorder(): RowSink & { seen: Seen[] } {
  const seen: Seen[] = [];
  return {
    seen,
    accept(timesS, values, count, firstRow) {
      seen.push({ times: timesS ? Array.from(timesS.subarray(0, count)) : null, values: values.map((v) => Array.from(v.subarray(0, count))), count, firstRow });
    },
  };
}

/** Feeds three chunks of 4 rows (time + 2 channels) through reused buffers, as RowCollector does. */
function feed(store: RowStore): void {
  const times = new Float64Array(4);
  const values = [new Float64Array(4), new Float64Array(4)];
  for (let chunk = 0; chunk < 3; chunk++) {
    for (let r = 0; r < 4; r++) {
      const row = chunk * 4 + r;
      times[r] = row / 1000;
      values[0]![r] = row;
      values[1]![r] = -row;
    }
    store.accept(times, values, chunk === 2 ? 3 : 4, chunk * 4);
  }
}

test("hands every chunk on and replays copies of them: same numbers, chunks and row indices, though the buffers were reused", async () => {
  const first = recorder();
  const store = new RowStore(first, 1024);
  feed(store);
  expect(store.complete).toBe(true);
  const second = recorder();
  await store.replay(second);
  expect(second.seen).toEqual(first.seen);
  expect(second.seen.map((c) => c.firstRow)).toEqual([0, 4, 8]);
  expect(second.seen[2]!.values[1]).toEqual([-8, -9, -10]);
});

test("drops what it kept once the budget would be exceeded (the file is then read again), but still hands every chunk on", async () => {
  const first = recorder();
  // 3 numbers × 8 bytes × 4 rows = 96 bytes a chunk: two chunks fit in 200 bytes, the third does not.
  const store = new RowStore(first, 200);
  feed(store);
  expect(first.seen).toHaveLength(3);
  expect(store.complete).toBe(false);
  await expect(store.replay(recorder())).rejects.toThrow(/not kept/);
});

test("a budget of zero keeps nothing", () => {
  const store = new RowStore(recorder(), 0);
  expect(store.complete).toBe(false);
});
