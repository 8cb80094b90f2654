// The command line's flags become the same mapping and context the upload form produces.
import { describe, expect, test } from "vitest";
import { parseAnalyzeArgs, UsageError } from "@/lib/pipeline/parse-analyze-args";

describe("parseAnalyzeArgs", () => {
  test("maps flags to the mapping and the context", () => {
    const request = parseAnalyzeArgs([
      "a.csv",
      "b.csv",
      ...["--frequency", "60", "--interval", "1e-4", "--channel", "CH1=current", "--scale", "CH1=40", "--channel", "Aux=ignore", "--thd-order", "40"],
      ...["--limits", "ieee-519-2014-current", "--isc", "8200", "--il", "260", "--bus-voltage", "480", "--start", "2024-03-04T12:05:00Z"],
    ]);
    expect(request).toEqual({
      files: ["a.csv", "b.csv"],
      json: false,
      mapping: { frequencyHz: 60, sampleIntervalS: 1e-4, thdMaxOrder: 40, channels: { CH1: { quantity: "current", scale: 40 }, Aux: { ignore: true } } },
      context: { iscA: 8200, ilA: 260, busVoltageV: 480, busVoltageSource: "given" },
      limitSetKey: "ieee-519-2014-current",
      recordStartMs: Date.UTC(2024, 2, 4, 12, 5, 0),
      diagnose: false,
      mitigate: [],
    });
  });

  test("--bus-voltage wins over the bus voltage the system's nominal voltage would give", () => {
    const { context } = parseAnalyzeArgs(["a.csv", "--limits", "k", "--nominal-voltage", "400", "--bus-voltage", "415"]);
    // 400/√3 = 230.9 V → 231 V (IEC 60038:2009 Table 1, 230/400 V system).
    expect(context).toEqual({ busVoltageV: 415, busVoltageSource: "given", nominalVoltageV: 231 });
  });

  test("--sensor reads a clamp's label into the column's scale", () => {
    // A 10 mV/A clamp: 1 A primary gives 10 mV, so 1 V recorded is 100 A (common practice, no source).
    const { mapping } = parseAnalyzeArgs(["a.csv", "--channel", "CH2=current", "--sensor", "CH2=10mV/A"]);
    expect(mapping.channels).toEqual({ CH2: { quantity: "current", scale: 100 } });
    // A 100:5 CT: 5 A secondary stands for 100 A primary, ×20 (common practice, no source).
    expect(parseAnalyzeArgs(["a.csv", "--sensor", "Ib=100:5"]).mapping.channels).toEqual({ Ib: { scale: 20 } });
  });

  test.each([
    [["a.csv", "--sensor", "Ia=-10mV/A"], /--sensor Ia=-10mV\/A/],
    [["a.csv", "--sensor", "Ia=banana"], /--sensor Ia=banana/],
    [["a.csv", "--scale", "Ia=2", "--sensor", "Ia=10mV/A"], /both set its scale/],
  ])("refuses the sensor rating in %j", (argv, message) => {
    expect(() => parseAnalyzeArgs(argv)).toThrow(UsageError);
    expect(() => parseAnalyzeArgs(argv)).toThrow(message);
  });

  test.each([
    [["--json"], /no input file/],
    [["a.csv", "--frequency", "55"], /--frequency must be 50 or 60/],
    [["a.csv", "--scale", "Ia"], /NAME=VALUE/],
    [["a.csv", "--scale", "Ia=0"], /greater than zero, got "0"/],
    [["a.csv", "--scale", "Ia=-2"], /greater than zero, got "-2"/],
    [["a.csv", "--scale", "Ia=abc"], /greater than zero, got "abc"/],
    [["a.csv", "--channel", "Ia=amps"], /current, voltage or ignore/],
    [["a.csv", "--bogus"], /bogus/],
    [["a.csv", "--isc", "8200"], /--isc only makes sense with --limits/],
    [["a.csv", "--limits", "k", "--start", "yesterday"], /--start needs a date and time/],
    [["a.csv", "--limits", "k", "--start", "2024-03-04T12:00:00"], /with its offset/],
    [["a.csv", "--limits", "k", "--nominal-voltage", "0"], /--nominal-voltage needs a positive number/],
  ])("refuses %j", (argv, message) => {
    expect(() => parseAnalyzeArgs(argv)).toThrow(UsageError);
    expect(() => parseAnalyzeArgs(argv)).toThrow(message);
  });
});
