// Issue 9 §5: the scale field and the CLI accept a sensor's rating in its own terms. Expected
// scales are worked out by hand beside each row (scale = A or V at the primary per A or V recorded).
import { describe, expect, test } from "vitest";
import { parseSensorRating } from "@/lib/analysis/parse-sensor-rating";

describe("parseSensorRating: ratings as printed on clamps, probes, shunts and transformers", () => {
  test.each([
    // [text, quantity, expected scale, how]
    ["40", undefined, 40, "a plain number is the scale itself"],
    ["2,5", undefined, 2.5, "decimal comma"],
    ["x10", "voltage", 10, "probe attenuation ×10"],
    ["×100", "voltage", 100, "probe attenuation ×100"],
    ["10x", "voltage", 10, "multiplier written after"],
    ["100:5", "current", 20, "CT 100 A : 5 A → 100/5 = 20"],
    ["100:1", "voltage", 100, "probe 100:1"],
    ["1:100", "voltage", 100, "written output:input, a probe never amplifies → 100"],
    ["10 mV/A", "current", 100, "clamp 10 mV per A: 1 / 0.010 V/A = 100 A/V"],
    ["10mV/A", "current", 100, "without the space"],
    ["100 mV/A", "current", 10, "1 / 0.1 = 10 A/V"],
    ["0.1 V/A", "current", 10, "1 / 0.1 = 10 A/V"],
    ["1 mV/mA", "current", 1, "1e-3 V / 1e-3 A = 1 V/A → 1 A/V"],
    ["400 A/V", "current", 400, "input per output: the scale itself"],
    ["100 A / 5 A", "current", 20, "CT written with units: 20"],
    ["10 mV/V", "voltage", 100, "divider output 10 mV per V: 1 / 0.01 = 100"],
    ["1000 V/V", "voltage", 1000, "divider ratio"],
    ["10 mV per A", "current", 100, "'per' for '/'"],
    ["10 mΩ", "current", 100, "shunt: I = U / R → 1 / 0.010 Ω = 100 A/V"],
    ["0.5 ohm", "current", 2, "shunt 0.5 Ω → 2 A/V"],
  ] as [string, string | undefined, number, string][])("%s (%s) → %d: %s", (text, quantity, scale) => {
    const rating = parseSensorRating(text, quantity as "current" | "voltage" | undefined);
    expect(rating.ok).toBe(true);
    if (rating.ok) expect(rating.scale).toBeCloseTo(scale, 9);
  });

  test("the explanation says what was understood", () => {
    const rating = parseSensorRating("10 mV/A");
    expect(rating).toMatchObject({ ok: true, explanation: "10 mV/A → ×100 (A per V recorded)" });
  });

  test.each([
    ["0", /greater than zero/],
    ["-2", /greater than zero/],
    ["0 mV/A", /greater than zero/],
    ["-10 mV/A", /greater than zero/],
    ["0:5", /greater than zero/],
    ["", /give a scale factor/],
    ["abc", /cannot read "abc"/],
    ["10 mV/s", /write the rating in A and V/],
    ["10 Hz/A", /write the rating in A and V/],
  ])("%j is refused: %s", (text, message) => {
    const rating = parseSensorRating(text);
    expect(rating.ok).toBe(false);
    if (!rating.ok) expect(rating.message).toMatch(message);
  });

  test("a rating for the other quantity is refused", () => {
    expect(parseSensorRating("10 mV/A", "voltage")).toMatchObject({ ok: false, message: expect.stringMatching(/rating of a current sensor, but this column is a voltage/) });
    expect(parseSensorRating("1000 V/V", "current")).toMatchObject({ ok: false, message: expect.stringMatching(/voltage sensor, but this column is a current/) });
    expect(parseSensorRating("10 mΩ", "voltage")).toMatchObject({ ok: false });
  });
});
