// Decides from a header whether a column is the time axis, a current or a voltage, and which phase.
import type { Quantity } from "./types";
import type { ParsedHeader } from "./parse-header";

/** What a column is, as far as its header tells. */
export interface ColumnRole {
  role: "time" | "channel";
  /** null when neither name nor unit says current or voltage. */
  quantity: Quantity | null;
  /** "a" | "b" | "c" when the name carries a phase (a/b/c, L1/L2/L3, R/S/T, 1/2/3); null otherwise. */
  phase: "a" | "b" | "c" | null;
  /** Set when the name and the unit disagree (e.g. "Ia (mV)" from a current clamp). */
  conflict: string | null;
}

const TIME_NAMES = /^(time|t|zeit|temps|tiempo|x|sec|secs|seconds|timestamp|timestamps|reltime|relativetime|timesec)$/;
const PHASE_SUFFIX = /^(l?[123]|[abcrst])?n?$/;
const LINE_TO_LINE = /^(ab|bc|ca|12|23|31|l1l2|l2l3|l3l1|rs|st|tr)$/;
const QUANTITY_WORDS = /current|amps?|strom|voltage|volts?|spannung|phase|line|ph|rms/g;

function phaseOf(suffix: string): "a" | "b" | "c" | null {
  const s = suffix.replace(/n$/, "");
  if (s === "a" || s === "l1" || s === "r" || s === "1") return "a";
  if (s === "b" || s === "l2" || s === "s" || s === "2") return "b";
  if (s === "c" || s === "l3" || s === "t" || s === "3") return "c";
  return null;
}

/**
 * Classifies a column from its parsed header. Quantity comes from the name when the name is
 * explicit (I, Ia, IL1, I_1, "current L2"; V, U, Va, UL1N, "voltage b"), else from the unit (A, V).
 * When both speak and disagree the name wins (a clamp recorded in mV is still a current) and
 * `conflict` says so, so the caller can warn that a scale factor is needed.
 *
 * Complexity O(length of the header).
 *
 * @example
 * detectChannel(parseHeader("IL2 [A]"))  // { role: "channel", quantity: "current", phase: "b", conflict: null }
 * detectChannel(parseHeader("Time (ms)")) // { role: "time", ... }
 */
export function detectChannel(parsed: ParsedHeader): ColumnRole {
  const norm = parsed.name.toLowerCase().replace(/[^a-z0-9]/g, "");
  if (parsed.unit?.baseUnit === "s" || TIME_NAMES.test(norm)) {
    return { role: "time", quantity: null, phase: null, conflict: null };
  }
  let byName: Quantity | null = null;
  let phase: "a" | "b" | "c" | null = null;
  if (/current|amp|strom/.test(norm) || /voltage|volt|spannung/.test(norm)) {
    byName = /current|amp|strom/.test(norm) ? "current" : "voltage";
    const rest = norm.replace(QUANTITY_WORDS, "");
    phase = PHASE_SUFFIX.test(rest) ? phaseOf(rest) : null;
  } else {
    const letter = /^(i|v|u)(rms)?(.*)$/.exec(norm);
    if (letter) {
      const rest = letter[3] ?? "";
      const isLineToLine = letter[1] !== "i" && LINE_TO_LINE.test(rest);
      if (PHASE_SUFFIX.test(rest) || isLineToLine) {
        byName = letter[1] === "i" ? "current" : "voltage";
        phase = isLineToLine ? null : phaseOf(rest);
      }
    }
  }
  const byUnit: Quantity | null =
    parsed.unit?.baseUnit === "A" ? "current" : parsed.unit?.baseUnit === "V" ? "voltage" : null;
  const quantity = byName ?? byUnit;
  const conflict =
    byName && byUnit && byName !== byUnit
      ? `column "${parsed.header}" is named as a ${byName} but recorded in ${parsed.unitText}; give its scale factor`
      : null;
  return { role: "channel", quantity, phase, conflict };
}
