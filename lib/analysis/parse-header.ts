// Splits a column header such as "Ia (A)", "U_L1 [V]", "Ia_A", "Time/ms" or "Current in A" into a
// name and a unit. A unit is read only from a unit position, never from a word of the name.
import { parseUnit, type ParsedUnit } from "./parse-unit";

/** Where in the header the unit was written. */
export type UnitPosition = "bracket" | "slash" | "in" | "suffix" | "units-row";

/** A header cell taken apart. */
export interface ParsedHeader {
  /** The header text as written (trimmed, quotes removed): the channel's name in results. */
  header: string;
  /** The header without its unit part, e.g. "Ia". */
  name: string;
  /** The unit as written, e.g. "mA"; null when the header carries none. */
  unitText: string | null;
  unit: ParsedUnit | null;
  /** Where the unit came from; null without a unit. */
  unitPosition: UnitPosition | null;
}

/**
 * Separates the unit from a header cell. Unit positions: a trailing bracket `name (unit)`,
 * `name [unit]`, `name {unit}`; the quantity/unit form `name/unit` (ISO 80000-1 table headings);
 * `name in unit`; and a last `_unit` suffix. The unit must be one {@link parseUnit} knows, so
 * "I_a" stays the name of phase a's current, "I(D1)" a simulator's current through D1, and the
 * "A" of "Voltage Phase A" — a word of the name, not a unit position — stays a phase.
 *
 * Complexity O(length).
 *
 * @example
 * parseHeader("Ia (A)")  // { header: "Ia (A)", name: "Ia", unitText: "A", unit: { baseUnit: "A", toBase: 1 }, unitPosition: "bracket" }
 * parseHeader("V_L1_kV") // name "V_L1", unitText "kV", unitPosition "suffix"
 * parseHeader("I_a")     // name "I_a", unitText null
 */
export function parseHeader(cell: string): ParsedHeader {
  const header = cell.trim().replace(/^"(.*)"$/, "$1").trim();
  const forms: [RegExp, UnitPosition][] = [
    [/^(.*?)\s*[([{]\s*([^)\]}]*?)\s*[)\]}]\s*$/, "bracket"],
    [/^(.+?)\s*\/\s*([A-Za-zµμ%]{1,7})$/, "slash"],
    [/^(.+?)\s+in\s+([A-Za-zµμ%]{1,7})$/i, "in"],
    [/^(.+?)_+([A-Za-zµμ%]{1,7})$/, "suffix"],
  ];
  for (const [form, unitPosition] of forms) {
    const match = form.exec(header);
    if (!match) continue;
    const unitText = match[2] ?? "";
    const unit = parseUnit(unitText);
    const name = (match[1] ?? "").trim();
    if (unit) return { header, name: name || header, unitText, unit, unitPosition };
  }
  return { header, name: header, unitText: null, unit: null, unitPosition: null };
}
