// The system's nominal voltage → the bus voltage that picks the IEEE 519 table and the channels' nominal voltage.
import { describe, expect, test } from "vitest";
import { voltageContextFromSystem } from "@/lib/pipeline/voltage-context-from-system";
import { describeContext } from "@/lib/reports/format";

describe("voltageContextFromSystem", () => {
  // IEC 60038:2009 Table 1 lists three-phase systems as line-to-neutral/line-to-line pairs (230/400 V,
  // 277/480 V); the ratio of a star-connected system's line-to-line to line-to-neutral voltage is √3
  // (common practice, no source). 11000/√3 = 6350.9 V.
  test.each([
    [400, 231],
    [480, 277],
    [11000, 6351],
  ])("a %d V system is line-to-line: bus voltage = the system voltage, channels' nominal %d V", (systemV, channelV) => {
    expect(voltageContextFromSystem(systemV, {})).toEqual({ busVoltageV: systemV, busVoltageSource: "system-nominal", nominalVoltageV: channelV });
  });

  test("250 V and below is a single-phase line-to-neutral value, taken as it is (common practice, no source)", () => {
    expect(voltageContextFromSystem(230, {})).toEqual({ busVoltageV: 230, busVoltageSource: "system-nominal", nominalVoltageV: 230 });
    expect(voltageContextFromSystem(250, {}).nominalVoltageV).toBe(250);
    expect(voltageContextFromSystem(251, {}).nominalVoltageV).toBe(145);
  });

  test("given values win", () => {
    expect(voltageContextFromSystem(11000, { busVoltageV: 11500, nominalVoltageV: 6000 })).toEqual({ busVoltageV: 11500, busVoltageSource: "given", nominalVoltageV: 6000 });
  });
});

describe("the sheet says which voltage chose the band", () => {
  test("a bus voltage taken from the system's nominal voltage is labelled so; a given one is not", () => {
    expect(describeContext(voltageContextFromSystem(11000, {}))).toContainEqual(["Bus voltage", "11000 V (the system's nominal voltage; no bus voltage given)"]);
    expect(describeContext(voltageContextFromSystem(11000, { busVoltageV: 11500 }))).toContainEqual(["Bus voltage", "11500 V"]);
  });
});
