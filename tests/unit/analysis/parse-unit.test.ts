// Issue 12 §3/§5: the one unit parser (waveform headers, units rows, interval logs), table-driven.
// SI prefixes k = 10^3, m = 10^-3, µ = 10^-6, n = 10^-9: SI Brochure, 9th edition (2019), Table 7;
// h = 3600 s, min = 60 s: same, Table 8. Spellings (amps, sec, usec) are common practice, no source.
import { describe, expect, test } from "vitest";
import { parseUnit } from "@/lib/analysis/parse-unit";
import { suggestIntervalMapping } from "@/lib/intervals/suggest-interval-mapping";

describe("parseUnit", () => {
  test.each([
    ["A", "A", 1],
    ["mA", "A", 1e-3],
    ["kA", "A", 1e3],
    ["uA", "A", 1e-6],
    ["µA", "A", 1e-6],
    ["V", "V", 1],
    ["mV", "V", 1e-3],
    ["kV", "V", 1e3],
    ["(kV)", "V", 1e3],
    ["[mA]", "A", 1e-3],
    ["Volts", "V", 1],
    ["amps", "A", 1],
    ["Ampere", "A", 1],
    ["s", "s", 1],
    ["ms", "s", 1e-3],
    ["µs", "s", 1e-6],
    ["μs", "s", 1e-6], // Greek mu (U+03BC) as well as the micro sign (U+00B5)
    ["us", "s", 1e-6],
    ["ns", "s", 1e-9],
    ["sec", "s", 1],
    ["usec", "s", 1e-6],
    ["min", "s", 60],
    ["minutes", "s", 60],
    ["h", "s", 3600],
    ["hours", "s", 3600],
    ["%", "%", 1],
  ])("%s → %s × %d", (text, base, factor) => {
    expect(parseUnit(text)).toEqual({ baseUnit: base, toBase: factor });
  });

  test.each(["a", "v", "Hz", "W", "°C", "ks", "nA", "nV", "MV", "", "L1", "D1", "abc"])("%j is not a unit of a channel or a time axis", (text) => {
    expect(parseUnit(text)).toBeNull();
  });

  test("the interval-log suggestion reads units with the same parser (kA → A × 1000, mV → V × 0.001, min is a statistic there)", () => {
    const [, ka, mv, minimum] = suggestIntervalMapping(["Time", "I1 H5 avg [kA]", "U1 H3 avg (mV)", "I1 H5 min [A]"]).columns;
    expect(ka).toMatchObject({ unit: "A", scale: 1000 });
    expect(mv).toMatchObject({ unit: "V", scale: 1e-3 });
    expect(minimum).toMatchObject({ unit: "A", statistic: "min" });
    expect(minimum!.scale).toBeUndefined();
    // As a `_min` suffix after a channel's name it is no time unit but the statistic.
    expect(suggestIntervalMapping(["Time", "I1_H5_min"]).columns[1]).toMatchObject({ channel: "I1", order: 5, statistic: "min", use: false });
  });
});
