// Interval logs read as a stream (papaparse over a file) give what the in-memory import gives, and
// their chart series are thinned to about 2,000 points without hiding an excursion.
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterAll, describe, expect, test } from "vitest";
import { IntervalLogError } from "@/lib/intervals/errors";
import { importIntervalLog } from "@/lib/intervals/import-interval-log";
import { importIntervalLogFile } from "@/lib/intervals/import-interval-log-file";
import { inspectIntervalLog } from "@/lib/intervals/inspect-interval-log";
import { thinIntervalTrends } from "@/lib/intervals/thin-interval-trends";

const dir = mkdtempSync(path.join(os.tmpdir(), "ordwise-intervals-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
const write = (name: string, bytes: string | Buffer): string => {
  const file = path.join(dir, name);
  writeFileSync(file, bytes);
  return file;
};

describe("importIntervalLogFile", () => {
  test("the week fixture read as a stream equals the in-memory import", async () => {
    const file = "fixtures/intervals/week-10min-3ch.csv";
    const text = readFileSync(file, "utf8");
    const mapping = inspectIntervalLog(text).suggestion.mapping!;
    const fromFile = await importIntervalLogFile(file, mapping);
    // Anchored to the fixture itself (fixtures/intervals/generate.ts): 7 days × 144 ten-minute rows.
    expect(fromFile.timestampsMs.length).toBe(7 * 144);
    expect(fromFile.intervalS).toBe(600);
    // …and the streamed chunks change nothing against the whole text read at once.
    expect(fromFile).toEqual(importIntervalLog(text, mapping));
  }, 30_000);

  test("a Latin-1 log with a preamble, ';' cells, decimal commas and a quoted header holding the delimiter", async () => {
    // "µ" is one byte (0xB5) in Latin-1, which is not valid UTF-8 on its own.
    const text = 'Logger;Messgerät µ\n"Zeit";"I1 H1 [A]";"I1; H5 [A]"\n04.03.2024 00:00;100,0;5,25\n04.03.2024 00:10;100,0;5,5\n';
    const file = write("latin1.csv", Buffer.from(text, "latin1"));
    const mapping = {
      timestamp: { column: "Zeit" },
      columns: [
        { column: "I1 H1 [A]", channel: "I1", quantity: "current" as const, kind: "order" as const, order: 1, unit: "A" as const },
        { column: "I1; H5 [A]", channel: "I1", quantity: "current" as const, kind: "order" as const, order: 5, unit: "A" as const },
      ],
    };
    const log = await importIntervalLogFile(file, mapping);
    expect(Array.from(log.channels[0]!.orders.get(5)!)).toEqual([5.25, 5.5]);
    expect(Array.from(log.timestampsMs)).toEqual([Date.UTC(2024, 2, 4, 0, 0), Date.UTC(2024, 2, 4, 0, 10)]);
    expect(Array.from(log.lines)).toEqual([3, 4]);
  });

  test("a UTF-8 BOM is not part of the first header", async () => {
    const file = write("bom.csv", "\uFEFFTimestamp,I1 H1 [A],I1 H5 [A]\n2024-03-04T00:00:00Z,100,5\n2024-03-04T00:10:00Z,100,6\n");
    const text = readFileSync(file, "utf8");
    const log = await importIntervalLogFile(file, inspectIntervalLog(text).suggestion.mapping!);
    expect(Array.from(log.channels[0]!.orders.get(5)!)).toEqual([5, 6]);
  });

  test("a bad cell deep in the file is named by line and column", async () => {
    const rows = ["Timestamp,I1 H1 [A],I1 H5 [A]"];
    for (let k = 0; k < 5000; k++) rows.push(`${new Date(Date.UTC(2024, 2, 4) + k * 60_000).toISOString()},100,${k === 4321 ? "n/a" : "5"}`);
    const file = write("bad.csv", `${rows.join("\n")}\n`);
    const mapping = inspectIntervalLog(rows.slice(0, 10).join("\n")).suggestion.mapping!;
    const error = await importIntervalLogFile(file, mapping).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(IntervalLogError);
    // Header on line 1, row k on line k + 2.
    expect((error as IntervalLogError).message).toBe('line 4323, column "I1 H5 [A]": "n/a" is not a number');
  });
});

describe("thinIntervalTrends", () => {
  const trend = (rows: number, spikeAt: number) => ({
    channel: "I1",
    timestampsMs: Array.from({ length: rows }, (_, k) => k * 60_000),
    orders: [{ name: "h5", order: 5, unit: "%IL", values: Array.from({ length: rows }, (_, k) => (k === spikeAt ? 9 : 1)), limit: 7, ruleLimits: [] }],
    aggregates: [],
  });

  test("53,500 rows → 27 rows per point, 1,982 points, the one-row spike kept at its group's start", () => {
    // ⌈53500 / 2000⌉ = 27 rows per point; ⌈53500 / 27⌉ = 1982 points; row 40,000 is in group ⌊40000/27⌋ = 1481.
    const [thin] = thinIntervalTrends([trend(53_500, 40_000)]);
    expect(thin!.rowsPerPoint).toBe(27);
    expect(thin!.timestampsMs).toHaveLength(1982);
    expect(thin!.orders[0]!.values).toHaveLength(1982);
    expect(thin!.orders[0]!.values[1481]).toBe(9);
    expect(thin!.timestampsMs[1481]).toBe(1481 * 27 * 60_000);
    expect(thin!.orders[0]!.limit).toBe(7);
  });

  test("a week of 10-minute values (1,008 rows) is left as it is", () => {
    const [thin] = thinIntervalTrends([trend(1008, 3)]);
    expect(thin).toMatchObject({ rowsPerPoint: 1, timestampsMs: expect.any(Array) });
    expect(thin!.orders[0]!.values).toHaveLength(1008);
  });
});
