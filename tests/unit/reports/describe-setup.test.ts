// The set-up behind a result as the sheet, share page and PDF print it: an interval log's column map is
// summarised per channel (the full list on demand), the file's columns left out are named.
import { describe, expect, test } from "vitest";
import { describeSetup } from "@/lib/reports/describe-setup";

const col = (column: string, channel: string, kind: "order" | "thd" | "rms", unit: "A" | "%", order?: number, scale = 1) => ({
  column,
  channel,
  quantity: "current",
  kind,
  ...(order !== undefined ? { order } : {}),
  unit,
  statistic: "avg",
  scale,
});

const columns = [
  col("I1 H1 avg [A]", "I1", "order", "A", 1),
  col("I1 H2 avg [A]", "I1", "order", "A", 2),
  col("I1 H3 avg [A]", "I1", "order", "A", 3),
  col("I1 H5 avg [A]", "I1", "order", "A", 5),
  col("I1 H7 avg [A]", "I1", "order", "A", 7),
  col("I1 THD avg [%]", "I1", "thd", "%"),
  col("I1 rms avg [A]", "I1", "rms", "A"),
  col("I2 H1 avg [A]", "I2", "order", "A", 1, 100),
  col("I2 H3 avg [%]", "I2", "order", "%", 3),
];

function sheetWith(setup: Record<string, unknown>) {
  return {
    analysis: {
      result: { fundamentalHz: 50, sampleIntervalS: 600, channels: [] },
      setup: { mapping: { intervalMapping: { timestamp: { column: "Timestamp" }, columns } }, ...setup },
      fileSha256: "ab".repeat(32),
    },
  };
}

describe("describeSetup for an interval log", () => {
  test("summarises the column map per channel, with the full list as details, and names the unused columns", () => {
    const lines = describeSetup(sheetWith({ unmappedColumns: ["I1 H5 max [A]", "Comment"] }));
    const map = lines.find(([label]) => label === "Column map")!;
    expect(map[1]).toBe("9 columns on 2 channels; time from “Timestamp” — I1 (current, A): fundamental, orders 2, 3, 5, 7, THD, r.m.s.; I2 (current, A and %, scale × 100): fundamental, order 3");
    expect(map[2]).toHaveLength(9);
    expect(map[2]![0]).toBe("I1 H1 avg [A] → I1 h1 (A)");
    expect(map[2]![7]).toBe("I2 H1 avg [A] → I2 h1 (A, × 100)");
    expect(lines.find(([label]) => label === "Columns not used")).toEqual(["Columns not used", "I1 H5 max [A], Comment"]);
    expect(lines.map(([label]) => label)).toEqual(["Column map", "Columns not used", "Fundamental", "File SHA-256"]);
  });

  test("says every column is used when none was left out, and says nothing of it for results stored before it was recorded", () => {
    expect(describeSetup(sheetWith({ unmappedColumns: [] })).find(([label]) => label === "Columns not used")?.[1]).toBe("none — every column of the file is mapped");
    expect(describeSetup(sheetWith({})).some(([label]) => label === "Columns not used")).toBe(false);
  });
});
