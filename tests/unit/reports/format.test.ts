// The words and numbers every rendering of a result shares (lib/reports/format.ts, result-wording.ts,
// lib/compliance/format-number.ts): one formatter each, so the sheet, the PDF, the CSV, the what-if
// panel and the importers' messages say a value the same way. The conventions are the product's own
// (common practice, no source); each expected text is written out by hand.
import { describe, expect, test } from "vitest";
import { describeFilterReport } from "@/lib/mitigation/describe-filter-report";
import { failureReasonText, formatNumber, formatWhen, sentenceStart } from "@/lib/reports/format";
import { formatContextValue } from "@/lib/reports/band-wording";
import { formatDurationS } from "@/lib/reports/result-wording";

describe("formatNumber", () => {
  test.each([
    [2.30000001, undefined, "2.3"],
    [0.061234, undefined, "0.06123"],
    [0.061234, 3, "0.0612"],
    [7, 3, "7"],
    [3.5, 3, "3.5"],
    [12345.6, undefined, "12346"],
    [12345.6, 3, "12346"],
    [2_500_000, undefined, "2.500e+6"],
    [0.00005, 3, "5.00e-5"],
    [0, undefined, "0"],
    [-0.4567, undefined, "-0.4567"],
    [null, undefined, "—"],
    [Number.NaN, 3, "—"],
  ] as Array<[number | null, number | undefined, string]>)("%s to %s figures → %s", (x, significant, text) => {
    expect(formatNumber(x, significant)).toBe(text);
  });
});

describe("formatDurationS", () => {
  test.each([
    [0.4, "0.4 s"],
    [2.04, "2.04 s"],
    [90, "1 min 30 s"],
    [119.7, "2 min"],
    [600, "10 min"],
    [5460, "1 h 31 min"],
    [7199, "2 h"],
    [86_400, "24 h"],
    [172_800, "48 h"],
    [604_800, "7 days"],
  ])("%s s → %s", (seconds, text) => {
    expect(formatDurationS(seconds)).toBe(text);
  });
});

test("formatContextValue keeps six figures, so a value just below a bound is not printed as the bound", () => {
  expect(formatContextValue(49.99963)).toBe("49.9996");
  expect(formatContextValue(11000)).toBe("11000");
  expect(formatContextValue(3469020)).toBe("3469020");
  expect(formatContextValue(31.538461)).toBe("31.5385");
});

test("formatWhen: UTC to the minute from a Date or an ISO string, a dash for none", () => {
  expect(formatWhen(new Date("2024-03-04T10:01:59Z"))).toBe("2024-03-04 10:01 UTC");
  expect(formatWhen("2024-03-04T10:01:00+02:00")).toBe("2024-03-04 08:01 UTC");
  expect(formatWhen(null)).toBe("—");
});

test("a failure reason shown on its own starts with a capital; the engine's lower-case message is kept otherwise", () => {
  expect(failureReasonText("no sample interval: the file has no time column and its preamble states no sample interval or rate")).toBe(
    "No sample interval: the file has no time column and its preamble states no sample interval or rate",
  );
  expect(failureReasonText("The analysis could not be queued; try again.")).toBe("The analysis could not be queued; try again.");
  expect(failureReasonText(null)).toBe("No reason was recorded.");
  expect(sentenceStart("maximum of 1.5 s smoothed values over the observation period")).toBe("Maximum of 1.5 s smoothed values over the observation period");
});

test("a filter's report reads the same on the what-if panel and the PDF, with the IEEE Std 18-2012 duty limits it carries", () => {
  const duty = { rmsVoltagePercent: 104.2, peakVoltagePercent: 112.6, rmsCurrentPercent: 131.4, kvarPercent: 118.9, limits: { rmsVoltagePercent: 110, peakVoltagePercent: 120, rmsCurrentPercent: 180, kvarPercent: 135 }, withinLimits: true };
  expect(describeFilterReport({ kind: "passive-filter", parallelResonanceOrder: 4.183, capacitorDuty: duty })).toBe(
    "Filter: parallel resonance with the source near order 4.18; capacitor duty rms V 104 %, peak V 113 %, rms I 131 %, kvar 119 % of rating (IEEE Std 18-2012 limits 110/120/180/135 %).",
  );
  expect(describeFilterReport({ kind: "active-filter", ratingUsedA: 42.04, ratingUsedPercent: 42.04 })).toBe("Active filter: 42.0 A used (42 % of its rating).");
});
