// Decides from a header whether a column is the time axis, a current or a voltage, and which
// phase — by whole tokens, never substrings. The one recogniser of waveform files and interval logs.
import type { ParsedHeader } from "./parse-header";
import type { ParsedUnit } from "./parse-unit";
import { tokenizeHeader, type HeaderToken } from "./tokenize-header";
import type { PhaseLabel, Quantity } from "./types";

/** What a column is, as far as its header tells. */
export interface ColumnRole {
  role: "time" | "channel";
  /** null when neither name nor unit says current or voltage. */
  quantity: Quantity | null;
  /** "a" | "b" | "c" when the name designates one phase (a/b/c, L1/L2/L3, 1/2/3, "phase R/S/T"); null otherwise. */
  phase: PhaseLabel | null;
  /** The name designates two phases (U12, Vab, "Voltage L1-L2"): a line-to-line quantity, phase null. */
  lineToLine: boolean;
  /** Short channel designation ("I1", "Ia", "IL2", "U12", "VN", "L1"), for grouping interval-log columns; null when the name has none. */
  label: string | null;
  /** The unit after recognition (a `_A` suffix on a voltage's name is its phase, not amperes). */
  unit: ParsedUnit | null;
  unitText: string | null;
  /** The name's tokens, for callers that read more from it (harmonic order, statistic). */
  tokens: HeaderToken[];
  /** Set when the name and the unit disagree (e.g. "Ia (mV)" from a current clamp). */
  conflict: string | null;
}

// Word lists: the quantity words of English, German, French, Spanish, Italian and Dutch exports
// (common practice, no source).
const CURRENT_WORDS = new Set(["current", "currents", "amp", "amps", "ampere", "amperes", "strom", "courant", "corriente", "corrente", "stroom"]);
const VOLTAGE_WORDS = new Set(["voltage", "voltages", "volt", "volts", "spannung", "tension", "tensione", "spanning"]);
const TIME_WORDS = new Set(["time", "t", "zeit", "temps", "tiempo", "tempo", "tijd", "sec", "secs", "second", "seconds", "timestamp", "reltime", "timesec"]);
const TIME_FILLERS = new Set(["rel", "relative", "elapsed", "stamp", "since", "start", "of", "day"]);
const PHASE_WORDS = new Set(["phase", "ph", "leiter"]);
/**
 * A quantity letter with what may be fused to it: I (current), U or V (voltage), optionally rms,
 * L or ph, then a phase (a/b/c), a pair (ab/bc/ca), neutral (n, an…), or dc/ac.
 */
const COMPACT = /^([iuv])(rms|trms|eff|pk)?(l|ph)?(a|b|c|n|an|bn|cn|ab|bc|ca|dc|ac)?$/;

const PHASE_OF: Record<string, PhaseLabel> = { a: "a", b: "b", c: "c", "1": "a", "2": "b", "3": "c", r: "a", s: "b", t: "c" };

/**
 * Reads phase designators from token `start` on: "L" + 1/2/3, one digit 1/2/3 (or a pair 12/23/31),
 * letters a/b/c (or ab/bc/ca), n (neutral, the reference: no phase); r/s/t only after a phase word.
 * After a digit only "n" or another "L" + digit may follow, so "I1 3rd harmonic" stays phase a.
 */
function designatorsAt(tokens: HeaderToken[], start: number, allowRst: boolean): { phases: PhaseLabel[]; text: string; end: number } {
  const phases: PhaseLabel[] = [];
  let text = "";
  let i = start;
  let afterDigit = false;
  while (i < tokens.length) {
    const t = tokens[i]!.lower;
    const next = tokens[i + 1]?.lower;
    if (t === "l" && next !== undefined && /^[123]$/.test(next)) {
      phases.push(PHASE_OF[next]!);
      text += `L${next}`;
      afterDigit = true;
      i += 2;
    } else if (t === "n" && i > start) {
      text += "n";
      i++;
    } else if (afterDigit) {
      break;
    } else if (/^[123]$/.test(t) || /^(12|23|31|13|21|32)$/.test(t)) {
      for (const ch of t) phases.push(PHASE_OF[ch]!);
      text += t;
      afterDigit = true;
      i++;
    } else if (/^[abc]$/.test(t) || /^(ab|bc|ca)$/.test(t) || (allowRst && /^[rst]$/.test(t))) {
      for (const ch of t) phases.push(PHASE_OF[ch]!);
      text += t;
      i++;
    } else {
      break;
    }
  }
  return { phases, text, end: i };
}

/** "a"/"ab"/"an" stay lower case (phase letters), digits and L/N upper case: I1, Ia, IL2, Uab, IN. */
function labelSuffix(text: string): string {
  return /^[abc][abcn]?$/i.test(text) ? text.toLowerCase() : text.toUpperCase();
}

/**
 * Classifies a column from its parsed header, by whole tokens of its name
 * ({@link tokenizeHeader}): quantity words (current, Strom, voltage, Spannung…), a quantity
 * letter with its phase (I, Ia, IL1, I_1, U12, Van, Vrms), a simulator's `I(D1)` / `V(n003)`, time
 * words (time, t, Zeit, sec…). Units come only from a unit position ({@link parseHeader}); when
 * name and unit disagree the name wins (a clamp recorded in mV is still a current) and `conflict`
 * says so, so the caller can ask for a scale factor. "Sample", "Amplitude", "Ramp", "X" and "CH1"
 * name nothing: quantity null, for the user to choose.
 *
 * Complexity O(length of the header).
 *
 * @example
 * detectChannel(parseHeader("IL2 [A]"))          // { role: "channel", quantity: "current", phase: "b", … }
 * detectChannel(parseHeader("Voltage Phase A"))  // { role: "channel", quantity: "voltage", phase: "a", unit: null, … }
 * detectChannel(parseHeader("Time (ms)"))        // { role: "time", … }
 */
export function detectChannel(parsed: ParsedHeader): ColumnRole {
  let { unit, unitText } = parsed;
  const tokens = tokenizeHeader(parsed.name);
  const words = tokens.map((t) => t.lower);
  const base = { unit, unitText, tokens, lineToLine: false, conflict: null };
  let suffixDropped = false;

  // A simulator's probe: I(device) or V(node) — the bracket names a device or node, never a phase.
  const probe = /^([IVUivu])\s*\(([^()]+)\)$/.exec(parsed.name.trim());

  let byName: Quantity | null = null;
  const phases: PhaseLabel[] = [];
  let letter = "";
  let designation = "";
  let label: string | null = null;
  if (probe) {
    byName = probe[1]!.toLowerCase() === "i" ? "current" : "voltage";
    label = parsed.name.trim();
  } else {
    const used = tokens.map(() => false);
    const take = (run: { phases: PhaseLabel[]; text: string; end: number }, from: number): void => {
      phases.push(...run.phases);
      designation += run.text;
      for (let k = from; k < run.end; k++) used[k] = true;
    };
    const hasCurrent = words.some((w) => CURRENT_WORDS.has(w));
    const hasVoltage = words.some((w) => VOLTAGE_WORDS.has(w));
    let after = -1;
    if (hasCurrent !== hasVoltage) {
      byName = hasCurrent ? "current" : "voltage";
      after = words.findIndex((w) => (hasCurrent ? CURRENT_WORDS : VOLTAGE_WORDS).has(w)) + 1;
      letter = hasCurrent ? "I" : "V";
    } else if (!hasCurrent) {
      const at = tokens.findIndex((t) => !t.numeric && COMPACT.test(t.lower));
      if (at >= 0) {
        const match = COMPACT.exec(tokens[at]!.lower)!;
        byName = match[1] === "i" ? "current" : "voltage";
        letter = tokens[at]!.text[0]!.toUpperCase();
        const fused = match[4] === "dc" || match[4] === "ac" ? "" : (match[4] ?? "");
        designation = `${match[3] === "l" ? "L" : ""}${fused}`;
        for (const ch of fused) if (ch !== "n") phases.push(PHASE_OF[ch]!);
        after = at + 1;
      }
    }
    if (after >= 0 && phases.length === 0) take(designatorsAt(tokens, after, false), after);
    // "Phase A", "Ph. R", "Leiter 2", and a free-standing L1/L2/L3 anywhere in the name.
    for (let i = 0; i < tokens.length; i++) {
      if (used[i]) continue;
      const w = words[i]!;
      if (PHASE_WORDS.has(w)) take(designatorsAt(tokens, i + 1, true), i + 1);
      else if (w === "l" && /^[123]$/.test(words[i + 1] ?? "")) take(designatorsAt(tokens, i, false), i);
    }
    // A `_A` suffix after a voltage's name is its phase ("V_A"), not amperes; a `_s` or `_min` after a
    // current's or voltage's name is no time unit either.
    if (byName && parsed.unitPosition === "suffix" && unit) {
      if (byName === "voltage" && unitText === "A" && phases.length === 0) {
        phases.push("a");
        designation += "a";
        unit = null;
        unitText = null;
        suffixDropped = true;
      } else if (unit.baseUnit === "s") {
        unit = null;
        unitText = null;
        suffixDropped = true;
      }
    }
    if (letter) label = `${letter}${labelSuffix(designation)}`;
    else if (/^L[123]/.test(designation)) label = labelSuffix(designation);
  }
  // A suffix that was no unit is a word of the name again (e.g. the statistic of "I1_H5_min").
  if (suffixDropped) base.tokens = tokenizeHeader(parsed.header);
  const distinct = [...new Set(phases)];
  const lineToLine = distinct.length > 1;
  const phase = distinct.length === 1 ? distinct[0]! : null;

  if (unit?.baseUnit === "s" || (byName === null && isTimeName(words))) {
    return { ...base, unit, unitText, role: "time", quantity: null, phase: null, label: null };
  }
  const byUnit: Quantity | null = unit?.baseUnit === "A" ? "current" : unit?.baseUnit === "V" ? "voltage" : null;
  const quantity = byName ?? byUnit;
  const conflict =
    byName && ((byUnit && byName !== byUnit) || unit?.baseUnit === "%")
      ? `column "${parsed.header}" is named as a ${byName} but recorded in ${unitText}; give its scale factor`
      : null;
  return { ...base, unit, unitText, role: "channel", quantity, phase, lineToLine, label, conflict };
}

/** The name is a time word, possibly with fillers: "Time", "t", "Zeit", "Rel. Time", "Time stamp", "Elapsed time". */
function isTimeName(words: string[]): boolean {
  const kept = words.filter((w) => !TIME_FILLERS.has(w));
  return kept.length === 1 && TIME_WORDS.has(kept[0]!);
}
