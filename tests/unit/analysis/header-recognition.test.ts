// Issue 9 §5 / issue 12 §5: header recognition, table-driven. Each row: a header as instruments,
// spreadsheets and circuit simulators write it, and what it says — role, quantity, phase, unit.
// Expected values are naming conventions of the trade (common practice, no source) unless a row
// says otherwise; rows marked "trap" are spellings a substring match got wrong.
import { describe, expect, test } from "vitest";
import { detectChannel } from "@/lib/analysis/detect-channel";
import { parseHeader } from "@/lib/analysis/parse-header";

type Expected = {
  role: "time" | "channel";
  quantity: "current" | "voltage" | null;
  phase: "a" | "b" | "c" | null;
  /** Base unit and factor to it, or null when the header carries no unit. */
  unit: [string, number] | null;
  lineToLine?: boolean;
};

const T = (unit: [string, number] | null = null): Expected => ({ role: "time", quantity: null, phase: null, unit });
const I = (phase: Expected["phase"], unit: Expected["unit"] = null): Expected => ({ role: "channel", quantity: "current", phase, unit });
const V = (phase: Expected["phase"], unit: Expected["unit"] = null): Expected => ({ role: "channel", quantity: "voltage", phase, unit });
const VLL = (unit: Expected["unit"] = null): Expected => ({ role: "channel", quantity: "voltage", phase: null, unit, lineToLine: true });
const NONE = (unit: Expected["unit"] = null): Expected => ({ role: "channel", quantity: null, phase: null, unit });

// [header, expected, note]
const rows: [string, Expected, string][] = [
  // Traps: substring matches that used to misread the column.
  ["Sample", NONE(), "trap: an index column, not 'amp'"],
  ["Samples", NONE(), "trap"],
  ["Amplitude", NONE(), "trap: 'amp' inside a word"],
  ["Lamp voltage", V(null), "trap: 'amp' inside 'Lamp' made it a current"],
  ["Ramp", NONE(), "trap: 'amp' + trailing letter read as phase a"],
  ["Example", NONE(), "trap: 'amp' inside a word"],
  ["i(t)", I(null), "trap: the t of i(t) was phase c (R/S/T)"],
  ["v(t)", V(null), "trap"],
  ["X", NONE(), "trap: a column named X was taken as time"],
  ["x", NONE(), "trap"],
  ["Voltage Phase A", V("a"), "trap: the trailing A read as amperes"],
  ["Current Phase B", I("b"), "trap"],
  ["Index", NONE(), "trap: i + 'ndex'"],
  ["Ideal", NONE(), "trap"],
  ["Input", NONE(), "trap: 'in' at the start"],
  ["Value", NONE(), "trap: v + 'alue'"],
  ["Valid", NONE(), "trap"],
  ["Vector", NONE(), "trap"],
  ["Unit", NONE(), "trap: u + 'nit'"],
  ["Timer", NONE(), "trap: 'time' inside a word"],
  ["Lifetime", NONE(), "trap"],
  ["CH1 (A)", I(null, ["A", 1]), "trap: channel 1 of a scope is not phase 1"],
  ["Ch2 (mV)", V(null, ["V", 1e-3]), "trap: channel 2 is not phase b; mV → V"],
  ["Channel 3", NONE(), "trap: not phase c"],
  ["I(D1)", I(null), "trap: circuit-simulator current through diode D1 (the 1 is the part, not phase 1)"],
  ["V(n003)", V(null), "trap: circuit-simulator node voltage"],
  ["I(L1)", I(null), "trap: current through inductor L1 in a simulator export, not phase L1"],
  ["i_load", I(null), "trap: snake case was not recognised"],
  ["v_bus", V(null), "trap: snake case was not recognised"],
  ["iLoad", I(null), "trap: camel case"],
  ["VBus", V(null), "trap: camel case"],
  ["I1 3rd harmonic", I("a"), "trap: the 3 of 3rd is an order, not a second phase"],
  ["Frequency (Hz)", NONE(), "trap: Hz is no unit of a channel"],
  ["Temp (°C)", NONE(), "trap"],
  ["Power (W)", NONE(), "trap"],
  ["V_A", V("a"), "trap: a _A suffix after a voltage's name is its phase"],
  ["Voltage (A)", { ...V(null, ["A", 1]) }, "trap: name and unit disagree, the name wins (conflict)"],
  ["Strom (mV)", I(null, ["V", 1e-3]), "a current clamp recorded in mV: current, unit kept for the scale"],
  // Ordinary spellings.
  ["Ia [A]", I("a", ["A", 1]), ""],
  ["Ib (A)", I("b", ["A", 1]), ""],
  ["IC", I("c"), ""],
  ["IL1", I("a"), ""],
  ["IL2 [A]", I("b", ["A", 1]), ""],
  ["I_3", I("c"), ""],
  ["I1", I("a"), ""],
  ["Current L1", I("a"), ""],
  ["Current 2", I("b"), ""],
  ["Load current (A)", I(null, ["A", 1]), ""],
  ["Phase A Current", I("a"), ""],
  ["L3 current", I("c"), ""],
  ["Strom L2 (A)", I("b", ["A", 1]), "German"],
  ["Courant phase 1", I("a"), "French"],
  ["Irms", I(null), ""],
  ["IN", I(null), "neutral current: no phase"],
  ["Ia_A", I("a", ["A", 1]), "unit as a _ suffix"],
  ["Current in mA", I(null, ["A", 1e-3]), "unit after 'in'"],
  ["Ia/A", I("a", ["A", 1]), "quantity/unit heading (ISO 80000-1 style)"],
  ["Amps", I(null), ""],
  ["Va", V("a"), ""],
  ["VA", V("a"), ""],
  ["Van", V("a"), "to neutral"],
  ["UL1N", V("a"), ""],
  ["U_L2 [V]", V("b", ["V", 1]), ""],
  ["V_L1_kV", V("a", ["V", 1e3]), ""],
  ["Spannung L3 [V]", V("c", ["V", 1]), "German"],
  ["Voltage b", V("b"), ""],
  ["Vrms L2", V("b"), ""],
  ["Phase R voltage", V("a"), "R/S/T phase names after 'phase'"],
  ["Volts", V(null), ""],
  ["U12", VLL(), "line-to-line: no single phase"],
  ["Uab", VLL(), ""],
  ["Voltage L1-L2", VLL(), ""],
  ["UL1-L2 (kV)", VLL(["V", 1e3]), ""],
  ["Time", T(), ""],
  ["time (s)", T(["s", 1]), ""],
  ["t", T(), ""],
  ["T", T(), ""],
  ["Time (ms)", T(["s", 1e-3]), ""],
  ["Zeit (µs)", T(["s", 1e-6]), "German"],
  ["Time (h)", T(["s", 3600]), "hour: SI Brochure, 9th edition (2019), Table 8"],
  ["t [min]", T(["s", 60]), "minute: SI Brochure, 9th edition (2019), Table 8"],
  ["Rel. Time", T(), ""],
  ["Timestamp", T(), ""],
  ["Sec", T(), ""],
  ["Time/ms", T(["s", 1e-3]), ""],
  ["CH4 (us)", T(["s", 1e-6]), "a time unit makes it the time axis"],
];

describe("header recognition: whole tokens, units only from a unit position", () => {
  test("the table holds at least 60 spellings, at least half of them traps", () => {
    expect(rows.length).toBeGreaterThanOrEqual(60);
    expect(rows.filter((r) => r[2].startsWith("trap")).length).toBeGreaterThanOrEqual(30);
  });

  test.each(rows)("%s", (header, expected) => {
    const role = detectChannel(parseHeader(header));
    expect({ role: role.role, quantity: role.quantity, phase: role.phase }).toEqual({
      role: expected.role,
      quantity: expected.quantity,
      phase: expected.phase,
    });
    expect(role.unit ? [role.unit.baseUnit, role.unit.toBase] : null).toEqual(expected.unit);
    if (expected.lineToLine !== undefined) expect(role.lineToLine).toBe(expected.lineToLine);
  });

  test("a name/unit disagreement is flagged for a scale factor, an agreement is not", () => {
    expect(detectChannel(parseHeader("Ia (mV)")).conflict).toMatch(/named as a current but recorded in mV/);
    expect(detectChannel(parseHeader("Ia (mA)")).conflict).toBeNull();
    expect(detectChannel(parseHeader("Ia (%)")).conflict).toMatch(/recorded in %; give its scale factor/);
  });

  test("channel labels for grouping interval-log columns", () => {
    const label = (h: string): string | null => detectChannel(parseHeader(h)).label;
    expect(["I1 H5 avg [A]", "Ia_h05 (A)", "IL2 5th harmonic (A)", "U12 rms", "Harm 11 I3 mean [A]", "IN", "UL1N"].map(label)).toEqual([
      "I1", "Ia", "IL2", "U12", "I3", "IN", "UL1N",
    ]);
  });
});
