// Interval logs: mapping suggestions, timestamp formats, import errors and gaps, and the IEEE Std
// 519-2014 §5.2 percentile rules over a week of 10-minute values. Fixtures: fixtures/intervals/generate.ts
// writes known values (written out beside each check); expected statistics are worked by hand from them.
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { describe, expect, test } from "vitest";
import { getSeedLimitSet } from "@/lib/compliance/seed";
import { IntervalLogError } from "@/lib/intervals/errors";
import { evaluateIntervalLog } from "@/lib/intervals/evaluate-interval-log";
import { importIntervalLog } from "@/lib/intervals/import-interval-log";
import { inspectIntervalLog } from "@/lib/intervals/inspect-interval-log";
import { parseTimestamp } from "@/lib/intervals/parse-timestamp";
import { suggestIntervalMapping } from "@/lib/intervals/suggest-interval-mapping";
import type { IntervalMappingInput } from "@/lib/intervals/types";

const fixture = (name: string): string => readFileSync(join(__dirname, "../../../fixtures/intervals", name), "utf8");
const limitSet = (key: string) => {
  const set = getSeedLimitSet(key)!;
  return { key, name: set.name, revision: { id: `seed:${key}`, number: 1 }, content: set.content };
};
// Isc/IL = 100 at 480 V → IEEE Std 519-2014 Table 2 row 100 ≤ Isc/IL < 1000: odd 3 ≤ h < 11 → 12 % of IL (as printed in the standard).
const CONTEXT = { iscA: 10_000, ilA: 100, busVoltageV: 480 };

describe("parseTimestamp (accepted: ISO 8601, YYYY-MM-DD HH:MM:SS, DD.MM.YYYY HH:MM:SS)", () => {
  test.each([
    ["2024-03-04T12:10:00Z", Date.UTC(2024, 2, 4, 12, 10)],
    ["2024-03-04T12:10:00+01:00", Date.UTC(2024, 2, 4, 11, 10)],
    ["2024-03-04 12:10", Date.UTC(2024, 2, 4, 12, 10)],
    ["2024-03-04 12:10:05.250", Date.UTC(2024, 2, 4, 12, 10, 5, 250)],
    ["04.03.2024 12:10:00", Date.UTC(2024, 2, 4, 12, 10)],
    ["4.3.2024 07:00", Date.UTC(2024, 2, 4, 7, 0)],
  ])("%s", (text, expected) => {
    expect(parseTimestamp(text)).toBe(expected);
  });

  test.each(["31.02.2024 10:00", "2024-13-01 00:00", "03/04/2024 12:00", "12:10", "2024-03-04 24:00"])("rejects %s", (text) => {
    expect(parseTimestamp(text)).toBeNull();
  });

  test("zone-less times are read with the mapping's offset; `dmy` refuses ISO", () => {
    expect(parseTimestamp("2024-03-04 12:10", "ymd", 60)).toBe(Date.UTC(2024, 2, 4, 11, 10));
    expect(parseTimestamp("2024-03-04 12:10", "dmy")).toBeNull();
  });
});

describe("suggestIntervalMapping (patterns only, no vendor layout)", () => {
  const headers = ["Timestamp", "I1 H1 avg [A]", "I1 H5 avg [A]", "I1 H5 max [A]", "I1 THD avg [%]", "I1 rms avg [A]", "Comment"];
  const suggestion = suggestIntervalMapping(headers);

  test("timestamp, orders, THD and r.m.s. with channel, quantity, unit and statistic", () => {
    expect(suggestion.timestamp).toEqual({ column: "Timestamp" });
    expect(suggestion.columns[2]).toMatchObject({ channel: "I1", quantity: "current", kind: "order", order: 5, unit: "A", statistic: "avg", use: true });
    expect(suggestion.columns[1]).toMatchObject({ kind: "order", order: 1 });
    expect(suggestion.columns[4]).toMatchObject({ kind: "thd", unit: "%", use: true });
    expect(suggestion.columns[5]).toMatchObject({ kind: "rms", unit: "A", use: true });
  });

  test("a max column is suggested but not used; an unrecognised column is unknown", () => {
    expect(suggestion.columns[3]).toMatchObject({ statistic: "max", use: false });
    expect(suggestion.columns[6]).toMatchObject({ role: "unknown", use: false });
    expect(suggestion.mapping?.columns.map((c) => c.column)).toEqual(["I1 H1 avg [A]", "I1 H5 avg [A]", "I1 THD avg [%]", "I1 rms avg [A]"]);
  });

  test.each([
    ["Ia_h05 (A)", { channel: "Ia", quantity: "current", order: 5, unit: "A" }],
    ["U1 Harmonic 7 [%]", { channel: "U1", quantity: "voltage", order: 7, unit: "%" }],
    ["IL2 5th harmonic (A)", { channel: "IL2", quantity: "current", order: 5, unit: "A" }],
    ["V1 THD", { channel: "V1", quantity: "voltage", kind: "thd", unit: "%" }],
    ["Harm 11 I3 mean [A]", { channel: "I3", order: 11, statistic: "avg" }],
    // The waveform import's recogniser (whole tokens, units from a unit position; common practice, no source):
    ["Current L1 H3 avg [A]", { channel: "IL1", quantity: "current", order: 3, unit: "A", statistic: "avg" }],
    ["Voltage Phase A H5 avg [V]", { channel: "Va", quantity: "voltage", order: 5, unit: "V" }],
    ["I1 H5 avg [kA]", { channel: "I1", quantity: "current", order: 5, unit: "A", scale: 1000, use: true }],
    ["I1 H3 p95 [A]", { channel: "I1", order: 3, statistic: "p95", use: false }],
    ["Lamp voltage rms [V]", { channel: "V", quantity: "voltage", kind: "rms", unit: "V" }],
  ])("%s", (header, expected) => {
    expect(suggestIntervalMapping(["Time", header]).columns[1]).toMatchObject(expected);
  });

  test.each(["Sample", "Amplitude", "Ramp"])("%s is not a channel (it used to match 'amp')", (header) => {
    expect(suggestIntervalMapping(["Time", header]).columns[1]).toMatchObject({ role: "unknown", use: false });
  });

  test("separate Date and Time columns become one timestamp", () => {
    expect(suggestIntervalMapping(["Date", "Time", "I1 H3 [A]"]).timestamp).toEqual({ column: "Date", timeColumn: "Time" });
  });
});

describe("importIntervalLog", () => {
  test("a week of 10-minute values (fixture): 1,008 rows, 3 channels, 10 orders + fundamental, no gaps", () => {
    const text = fixture("week-10min-3ch.csv");
    const preview = inspectIntervalLog(text);
    expect(preview).toMatchObject({ headerLine: 4, delimiter: ",", decimalSeparator: "." });
    const log = importIntervalLog(text, preview.suggestion.mapping!);
    expect(log.timestampsMs.length).toBe(1008);
    expect(log.intervalS).toBe(600);
    expect(log.channels.map((c) => c.name)).toEqual(["I1", "I2", "I3"]);
    expect([...log.channels[0]!.orders.keys()].sort((a, b) => a - b)).toEqual([1, 2, 3, 4, 5, 7, 9, 11, 13, 17, 19]);
    expect(log.gaps).toEqual([]);
    expect(log.lines[0]).toBe(5);
    // The suggested mapping leaves the three "H5 max" columns out (a max is not an average); the log names them.
    expect(log.unmappedColumns).toEqual(["I1 H5 max [A]", "I2 H5 max [A]", "I3 H5 max [A]"]);
  });

  test("gaps are reported with where and how long, not bridged (DD.MM.YYYY, ';', decimal comma)", () => {
    const text = fixture("day-gaps-dmy.csv");
    const preview = inspectIntervalLog(text);
    expect(preview).toMatchObject({ delimiter: ";", decimalSeparator: "," });
    const log = importIntervalLog(text, preview.suggestion.mapping!);
    expect(log.timestampsMs.length).toBe(144 - 3 - 12);
    expect(log.gaps).toEqual([
      { afterLine: 20, fromMs: Date.UTC(2024, 2, 4, 3, 10), toMs: Date.UTC(2024, 2, 4, 3, 40), durationS: 1800, missingIntervals: 3 },
      { afterLine: 83, fromMs: Date.UTC(2024, 2, 4, 14, 10), toMs: Date.UTC(2024, 2, 4, 16, 10), durationS: 7200, missingIntervals: 12 },
    ]);
    expect(log.warnings[0]).toBe(
      "gap of 30 min (3 intervals missing) between line 20 (2024-03-04 03:00 UTC) and line 21 (2024-03-04 03:40 UTC); not bridged",
    );
    expect(log.channels[0]!.orders.get(5)![0]).toBeCloseTo(4.99, 9);
  });

  const mappingOf = (name: string): IntervalMappingInput => inspectIntervalLog(fixture(name)).suggestion.mapping!;
  test.each([
    ["error-malformed-row.csv", "line 5: malformed row: expected 15 cells as in the header (line 1), found 13"],
    ["error-non-numeric.csv", 'line 4, column "I1 H5 avg [A]": "n/a" is not a number'],
    [
      "error-non-monotonic.csv",
      'line 6, column "Timestamp": timestamp 2024-03-04 00:30 UTC is the same as the previous row\'s (line 5, 2024-03-04 00:30 UTC); timestamps must increase',
    ],
  ])("%s → %s", (name, message) => {
    const text = fixture(name);
    const run = () => importIntervalLog(text, mappingOf("error-malformed-row.csv"));
    expect(run).toThrow(IntervalLogError);
    expect(run).toThrow(message);
  });

  // Issue 9 §2: double precision ends near 1.8·10^308 (IEEE 754-2019 §3.6, binary64); a square of 1e200 already overflows.
  test.each(["1e400", "1e200", "-3e150"])("a logged value of %s is out of range at its line and column (it used to judge as 'at the limit')", (cell) => {
    const text = `Time,I1 H1 [A],I1 H5 [A]\n2024-03-04 00:00,40,3\n2024-03-04 00:10,41,${cell}\n2024-03-04 00:20,40,3\n`;
    const mapping: IntervalMappingInput = {
      timestamp: { column: "Time" },
      columns: [
        { column: "I1 H1 [A]", channel: "I1", quantity: "current", kind: "order", order: 1, unit: "A" },
        { column: "I1 H5 [A]", channel: "I1", quantity: "current", kind: "order", order: 5, unit: "A" },
      ],
    };
    expect(() => importIntervalLog(text, mapping)).toThrow(new RegExp(`^line 3, column "I1 H5 \\[A\\]": "${cell.replace("+", "\\+")}" is out of range`));
  });

  test("mapping errors name the header line and column", () => {
    const text = "Time,I1 H5 [%]\n2024-03-04 00:00,3\n2024-03-04 00:10,4\n";
    expect(() =>
      importIntervalLog(text, { timestamp: { column: "Time" }, columns: [{ column: "I1 H5 [%]", channel: "I1", quantity: "current", kind: "order", order: 5, unit: "%" }] }),
    ).toThrow('line 1, column "I1 H5 [%]": is in % of the fundamental but channel I1 has no fundamental (order 1) column in A or V');
    expect(() =>
      importIntervalLog(text, { timestamp: { column: "Time" }, columns: [{ column: "I1 H7 [A]", channel: "I1", quantity: "current", kind: "order", order: 7, unit: "A" }] }),
    ).toThrow("no header line holds every mapped column");
  });

  test("% of fundamental columns are converted with the channel's fundamental", () => {
    const text = "Time;I1 H1 [A];I1 H5 [%]\n2024-03-04 00:00;80;10,5\n2024-03-04 00:10;100;8\n";
    const log = importIntervalLog(text, inspectIntervalLog(text).suggestion.mapping!);
    expect(Array.from(log.channels[0]!.orders.get(5)!)).toEqual([8.4, 8]);
  });
});

describe("evaluateIntervalLog: IEEE Std 519-2014 weekly percentiles of 10-minute values (§5.2, multipliers from memory)", () => {
  // h5 = 0.0125·r A and h7 = 0.013·r A, r a permutation of 1..1008, I1 = 100 A, IL = 100 A (so A = % of IL).
  // Nearest rank (common practice, no source; IEEE Std 519-2014 §5.2 names the percentile, not the method): p95 = the ⌈0.95·1008⌉ = 958th value, p99 = the ⌈0.99·1008⌉ = 998th.
  const rank = (k: number): number => ((k * 389) % 1008) + 1;
  const lines = ["Timestamp,I1 H1 avg [A],I1 H5 avg [A],I1 H7 avg [A]"];
  for (let k = 0; k < 1008; k++) {
    lines.push(`${new Date(Date.UTC(2024, 2, 4) + k * 600_000).toISOString()},100,${(0.0125 * rank(k)).toFixed(4)},${(0.013 * rank(k)).toFixed(4)}`);
  }
  const text = lines.join("\n");
  const log = importIntervalLog(text, inspectIntervalLog(text).suggestion.mapping!);
  const result = evaluateIntervalLog(log, limitSet("ieee-519-2014-current"), CONTEXT);
  const row = (order: number) => result.rows.find((candidate) => candidate.order === order)!;
  const rule = (order: number, id: string) => row(order).rowRules!.find((candidate) => candidate.rule === id)!;

  test("h5: p95 = 958 × 0.0125 = 11.975 % < 12 % and p99 = 998 × 0.0125 = 12.475 % < 18 % → pass", () => {
    expect(rule(5, "weekly-p95-short").measured).toBeCloseTo(11.975, 9);
    expect(rule(5, "weekly-p99-short").measured).toBeCloseTo(12.475, 9);
    expect(row(5)).toMatchObject({ verdict: "pass", decidedBy: "weekly-p95-short" });
    expect(rule(5, "weekly-p95-short")).toMatchObject({ valueCount: 1008, periodCount: 1 });
  });

  test("h7: p95 = 958 × 0.013 = 12.454 % ≥ 1.0 × 12 % → fail", () => {
    expect(row(7)).toMatchObject({ verdict: "fail", decidedBy: "weekly-p95-short", limit: 12 });
    expect(row(7).measured).toBeCloseTo(12.454, 9);
    expect(result.verdict).toBe("fail");
  });

  test("the 3 s rule needs 3 s values, which a 10-minute log does not hold: not evaluated and named", () => {
    expect(rule(5, "daily-p99-very-short").reason).toBe("not evaluated: needs 3 s (150/180-cycle) values; the interval log holds 10 min values");
    expect(result.timeRules?.find((summary) => summary.rule === "daily-p99-very-short")?.status).toBe("not-evaluated");
    expect(result.timeBasis).toMatchObject({ source: "interval-log", valueS: 600, valueCount: 1008, durationS: 604_800, coverage: "partial" });
  });

  test("orders not logged are not evaluated ('not in the interval log'), never passed", () => {
    expect(row(11)).toMatchObject({ verdict: "not-evaluated", reason: "not in the interval log" });
  });

  test("trend series for charts: h5 in % of IL with its table and rule limits", () => {
    const h5 = result.trends[0]!.orders.find((series) => series.order === 5)!;
    expect(h5.values).toHaveLength(1008);
    expect(h5.values[0]).toBeCloseTo(0.0125 * rank(0), 9);
    expect(h5).toMatchObject({ unit: "%IL", limit: 12 });
    expect(h5.ruleLimits.map((limit) => [limit.rule, limit.limit])).toEqual([
      ["daily-p99-very-short", 24],
      ["weekly-p99-short", 18],
      ["weekly-p95-short", 12],
    ]);
    expect(result.trends[0]!.timestampsMs[1]! - result.trends[0]!.timestampsMs[0]!).toBe(600_000);
  });
});

describe("evaluateIntervalLog on the fixtures", () => {
  // Speed of import + evaluation lives in `npm run bench` (interval-log-week-3ch, interval-log-60mb).
  test("week fixture: 3 channels, TDD from the logged THD column, trends with TDD", () => {
    const text = fixture("week-10min-3ch.csv");
    const log = importIntervalLog(text, inspectIntervalLog(text).suggestion.mapping!);
    const result = evaluateIntervalLog(log, limitSet("ieee-519-2014-current"), CONTEXT);
    expect(result.channels).toHaveLength(3);
    const tdd = result.aggregates.find((aggregate) => aggregate.name === "TDD")!;
    expect(tdd.rowRules?.find((candidate) => candidate.rule === "weekly-p95-short")?.reason).toContain("from the logged THD × the fundamental");
    // The card's remark: the deciding rule over the logged THD, and no word of the r.m.s. mean of the logged orders
    // (a partial sum the verdict did not use), nor of "the partial value".
    expect(tdd.decidedBy).toBe("weekly-p95-short");
    expect(tdd.reason).toContain("over the logger's own order range (orders 6–50 (39 orders) are not logged one by one)");
    expect(tdd.reason).not.toMatch(/partial|unavailable|above Nyquist/);
    expect(tdd.reason).toContain("1 time rule not applied to this record (see Notes)");
    expect(result.trends[0]!.aggregates.find((series) => series.name === "TDD")?.values).toHaveLength(1008);
  });

  test("a log shorter than one 10-minute interval is not evaluated for the 10-minute rules", () => {
    const text = "Timestamp,I1 H1 [A],I1 H5 [A]\n2024-03-04 00:00:00,100,5\n2024-03-04 00:00:03,100,5\n2024-03-04 00:00:06,100,5\n";
    const log = importIntervalLog(text, inspectIntervalLog(text).suggestion.mapping!);
    const result = evaluateIntervalLog(log, limitSet("ieee-519-2014-current"), CONTEXT);
    const h5 = result.rows.find((candidate) => candidate.order === 5)!;
    expect(h5.rowRules?.find((candidate) => candidate.rule === "weekly-p95-short")?.reason).toBe(
      "not evaluated: needs at least 10 min of record; the record has 9 s",
    );
    // 3 s values logged directly: the daily 99th percentile is evaluated over 9 s with a note.
    expect(h5.rowRules?.find((candidate) => candidate.rule === "daily-p99-very-short")).toMatchObject({ verdict: "pass", measured: 5, limit: 24 });
    expect(h5).toMatchObject({ verdict: "pass", decidedBy: "daily-p99-very-short" });
  });

  test("the IEC 61000-3-2 smoothed rules need window values: an interval log gives not-evaluated rows", () => {
    const text = "Timestamp,I1 H1 [A],I1 H3 [A]\n2024-03-04 00:00:00,8,1\n2024-03-04 00:10:00,8,1\n";
    const log = importIntervalLog(text, inspectIntervalLog(text).suggestion.mapping!);
    const result = evaluateIntervalLog(log, limitSet("iec-61000-3-2-class-a"), {});
    expect(result.rows.find((candidate) => candidate.order === 3)?.reason).toContain("needs 10/12-cycle window values (for the 1.5 s smoothing)");
    expect(result.verdict).toBe("incomplete");
  });
});
