// Nearest-rank percentiles and order statistics.
import { describe, expect, test } from "vitest";
import { orderStatistic } from "@/lib/analysis/order-statistic";
import { percentile } from "@/lib/analysis/percentile";

describe("percentile (nearest rank: the ⌈p/100·n⌉-th smallest value)", () => {
  // Classic nearest-rank worked example (common practice): {15, 20, 35, 40, 50}.
  test.each([
    [5, 15],
    [30, 20],
    [40, 20],
    [50, 35],
    [100, 50],
    [0, 15],
  ])("p%i of {15, 20, 35, 40, 50} = %i (nearest-rank definition, common practice)", (p, expected) => {
    expect(percentile([50, 15, 40, 20, 35], p)).toBe(expected);
  });

  test("p95 of 1..100 = 95 and p99 = 99: exceeded by exactly 5 % and 1 % of the values (IEEE Std 519-2014 §3.1 percentile definition)", () => {
    const values = Array.from({ length: 100 }, (_, i) => 100 - i);
    expect(percentile(values, 95)).toBe(95);
    expect(percentile(values, 99)).toBe(99);
  });

  test("p7 of 100 values does not suffer from 0.07·100 = 7.000000000000001 (rank 7, not 8)", () => {
    expect(percentile(Array.from({ length: 100 }, (_, i) => i + 1), 7)).toBe(7);
  });

  test("does not modify its input", () => {
    const values = [3, 1, 2];
    percentile(values, 50);
    expect(values).toEqual([3, 1, 2]);
  });

  test.each([[[], 50, "percentile requires at least one value"], [[1], 101, "percentile requires 0 ≤ p ≤ 100, got 101"]] as const)(
    "rejects %j p=%i",
    (values, p, message) => {
      expect(() => percentile(values as unknown as number[], p)).toThrow(message);
    },
  );
});

describe("orderStatistic (quickselect)", () => {
  test("matches a full sort on 2 000 pseudo-random values with duplicates", () => {
    let seed = 7;
    const random = (): number => ((seed = (seed * 16807) % 2147483647) / 2147483647);
    const values = Float64Array.from({ length: 2000 }, () => Math.round(random() * 300));
    const sorted = Float64Array.from(values).sort();
    for (const k of [0, 1, 999, 1500, 1999]) expect(orderStatistic(Float64Array.from(values), k)).toBe(sorted[k]);
  });

  test("sorted and reverse-sorted inputs", () => {
    const up = Float64Array.from({ length: 1000 }, (_, i) => i);
    expect(orderStatistic(Float64Array.from(up), 990)).toBe(990);
    expect(orderStatistic(up.reverse(), 10)).toBe(10);
  });

  test("rejects k outside 0..n−1", () => {
    expect(() => orderStatistic(Float64Array.from([1, 2]), 2)).toThrow("orderStatistic requires 0 ≤ k < 2, got 2");
  });
});
