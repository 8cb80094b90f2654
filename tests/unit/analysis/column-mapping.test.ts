// Issue 9 §5: every column is mappable — the user's choice of time axis, a column named in a
// setting that the file does not have, and scales that are not greater than zero.
import { describe, expect, test } from "vitest";
import { analyzeCsvText } from "@/lib/analysis/analyze-csv-text";
import { checkOverrideColumns } from "@/lib/analysis/check-override-columns";
import { detectLayout } from "@/lib/analysis/detect-layout";
import { AnalysisInputError } from "@/lib/analysis/errors";
import { inspectCsv } from "@/lib/analysis/inspect-csv";
import { planColumns } from "@/lib/analysis/plan-columns";
import { captureSetupSchema } from "@/lib/validations/capture";

/** 0.2 s of a 50 Hz pair at 10 kS/s (325 V and 10 A peak), with the header given. */
function capture(header: string): string {
  const lines = [header];
  for (let k = 0; k < 2000; k++) {
    const t = k / 10_000;
    lines.push(`${t.toFixed(5)},${(325 * Math.sin(2 * Math.PI * 50 * t)).toFixed(3)},${(10 * Math.sin(2 * Math.PI * 50 * t)).toFixed(4)}`);
  }
  return `${lines.join("\n")}\n`;
}

describe("columns a substring match could not map", () => {
  test("time,v_load,i_load: a time axis, a voltage and a current (it used to show no channel at all)", () => {
    const preview = inspectCsv(capture("time,v_load,i_load"));
    expect(preview.columns.map((c) => [c.role, c.quantity])).toEqual([["time", null], ["channel", "voltage"], ["channel", "current"]]);
    const result = analyzeCsvText(capture("time,v_load,i_load"));
    // 10 A peak → 10/√2 = 7.071 A r.m.s. (sine: r.m.s. = peak/√2).
    expect(result.channels.find((c) => c.name === "i_load")!.rms).toBeCloseTo(10 / Math.SQRT2, 2);
  });

  test("the user's choices: an unrecognised column chosen as time, others as voltage and current", () => {
    const text = capture("Sample,Col B,Col C");
    const before = planColumns(detectLayout(text, true), undefined);
    expect(before.map((c) => c.role)).toEqual(["skipped", "skipped", "skipped"]);
    const after = planColumns(detectLayout(text, true), { Sample: { time: true }, "Col B": { quantity: "voltage" }, "Col C": { quantity: "current" } });
    expect(after.map((c) => `${c.role}:${c.quantity}`)).toEqual(["time:null", "channel:voltage", "channel:current"]);
    const result = analyzeCsvText(text, { channels: { Sample: { time: true }, "Col B": { quantity: "voltage" }, "Col C": { quantity: "current" } } });
    expect(result.sampleIntervalS).toBeCloseTo(1e-4, 12);
  });

  test("choosing another column as time leaves the detected one out, with a note", () => {
    const plan = planColumns(detectLayout(capture("Time (s),t2,Ia (A)"), true), { t2: { time: true } });
    expect(plan.map((c) => c.role)).toEqual(["skipped", "time", "channel"]);
    expect(plan[0]!.note).toMatch(/another column is the time axis/);
  });
});

describe("checkOverrideColumns: a setting must name a column of the file", () => {
  const layout = detectLayout(capture("Time (s),Va (V),Ia (A)"), true);
  test("header text or name without unit, any case, are found", () => {
    expect(() => checkOverrideColumns(layout, { "Ia (A)": {}, va: {} })).not.toThrow();
  });
  test("an unknown name is an error listing the columns", () => {
    let error: unknown;
    try {
      checkOverrideColumns(layout, { Ib: { scale: 40 } });
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(AnalysisInputError);
    expect(error).toMatchObject({ code: "unknown-column" });
    expect((error as Error).message).toBe(
      'no column named "Ib"; the columns are "Time (s)", "Va (V)", "Ia (A)" (a column is named by its header or by its name without the unit)',
    );
  });
});

describe("a zero or negative scale is refused", () => {
  test.each([0, -1])("engine option scale %d", (scale) => {
    expect(() => analyzeCsvText(capture("Time (s),Va (V),Ia (A)"), { channels: { Ia: { scale } } })).toThrow(/must be a number greater than zero/);
  });
  test.each([0, -40])("mapping form / setup route schema, scale %d", (scale) => {
    const parsed = captureSetupSchema.safeParse({ mapping: { channels: { Ia: { quantity: "current", scale } } }, limitSetKey: "ieee-519", context: {} });
    expect(parsed.success).toBe(false);
    expect(JSON.stringify(parsed.error?.issues)).toMatch(/Scale must be greater than zero/);
  });
});
