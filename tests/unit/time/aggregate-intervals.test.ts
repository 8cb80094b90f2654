// 150/180-cycle (≈ 3 s) and 10-minute aggregation of window values (IEC 61000-4-30:2015
// §4.5.2–4.5.3 r.m.s. aggregation: square root of the mean of the squared inputs — from memory).
import { describe, expect, test } from "vitest";
import { aggregateIntervals } from "@/lib/analysis/aggregate-intervals";
import { planIntervals } from "@/lib/analysis/plan-intervals";

const WINDOW_S = 0.2; // 10 cycles at 50 Hz

describe("3 s values: r.m.s. of 15 consecutive windows", () => {
  test("groups of 15 from the record start; the trailing 7 windows are partial and unused", () => {
    // Group g holds windows alternating 3 and 4 scaled by g+1 → F_vs = (g+1)·√((8·9 + 7·16)/15).
    const values = Array.from({ length: 52 }, (_, k) => (Math.floor(k / 15) + 1) * (k % 2 === 0 ? 3 : 4));
    const plan = planIntervals(values.length, { groupSize: 15, valueS: WINDOW_S });
    expect(Array.from(plan.starts)).toEqual([0, 15, 30]);
    expect(plan.partial).toEqual([{ startS: 45 * WINDOW_S, valueCount: 7 }]);
    const veryShort = aggregateIntervals(values, plan);
    // Group 0 starts on an even index (8 threes, 7 fours); group 1 starts at 15 (odd → 7 threes, 8 fours).
    expect(veryShort[0]).toBeCloseTo(Math.sqrt((8 * 9 + 7 * 16) / 15), 12);
    expect(veryShort[1]).toBeCloseTo(2 * Math.sqrt((7 * 9 + 8 * 16) / 15), 12);
    expect(veryShort[2]).toBeCloseTo(3 * Math.sqrt((8 * 9 + 7 * 16) / 15), 12);
  });

  test("a group straddling a gap in the start times is partial", () => {
    const startsS = Array.from({ length: 30 }, (_, k) => k * WINDOW_S + (k >= 20 ? 5 : 0));
    const plan = planIntervals(30, { groupSize: 15, valueS: WINDOW_S, startsS });
    expect(plan.starts.length).toBe(1);
    expect(plan.partial).toHaveLength(1);
  });
});

describe("10-minute values: r.m.s. of the window values in each interval", () => {
  // 25 minutes of 200 ms windows: minutes 0–10 at 1.0, 10–20 at 2.0 for the first half and 4.0 for the second, then 5 min at 9.
  const perTen = 3000;
  const values = new Float64Array(perTen * 2 + 1500);
  values.fill(1, 0, perTen);
  values.fill(2, perTen, perTen + 1500);
  values.fill(4, perTen + 1500, 2 * perTen);
  values.fill(9, 2 * perTen);

  test("from the record start: two complete intervals, √10 for the second; the last 5 min are partial", () => {
    const plan = planIntervals(values.length, { intervalS: 600, valueS: WINDOW_S });
    const short = aggregateIntervals(values, plan);
    expect(Array.from(short)).toHaveLength(2);
    expect(short[0]).toBeCloseTo(1, 12);
    expect(short[1]).toBeCloseTo(Math.sqrt((4 + 16) / 2), 12); // √10 = 3.1623
    expect(plan.partial).toEqual([{ startS: 1200, valueCount: 1500 }]);
  });

  test("aligned to the clock: a record 12:05–12:30 UTC gives complete intervals 12:10–12:20 and 12:20–12:30", () => {
    const startEpochS = Date.UTC(2024, 2, 4, 12, 5, 0) / 1000;
    const startsS = Float64Array.from({ length: values.length }, (_, k) => startEpochS + k * WINDOW_S);
    const plan = planIntervals(values.length, { intervalS: 600, valueS: WINDOW_S, startsS, align: "clock" });
    expect(Array.from(plan.intervalStartS)).toEqual([Date.UTC(2024, 2, 4, 12, 10, 0) / 1000, Date.UTC(2024, 2, 4, 12, 20, 0) / 1000]);
    // 12:10–12:20 holds windows 1500..4499 (1.0 and 2.0 halves); 12:20–12:30 windows 4500..7499 (4.0 and 9.0 halves).
    const short = aggregateIntervals(values, plan);
    expect(short[0]).toBeCloseTo(Math.sqrt((1 + 4) / 2), 9);
    expect(short[1]).toBeCloseTo(Math.sqrt((16 + 81) / 2), 9);
    // 12:00–12:10 is covered only from 12:05: partial, not used.
    expect(plan.partial).toEqual([{ startS: Date.UTC(2024, 2, 4, 12, 0, 0) / 1000, valueCount: 1500 }]);
  });

  test("windows of a 49.95 Hz fundamental (200.2 ms) still fill a 10-minute interval", () => {
    const windowS = 10 / 49.95;
    const count = Math.ceil(600 / windowS) + 10;
    const plan = planIntervals(count, { intervalS: 600, valueS: windowS });
    expect(plan.starts.length).toBe(1);
    // Windows starting in [0, 600 s): k · 0.2002 s < 600 s → k < 2997 (600 s × 49.95 Hz / 10 cycles).
    expect(plan.ends[0]! - plan.starts[0]!).toBe(2997);
  });
});
