// Splits a column header such as "Ia (A)", "U_L1 [V]", "Ia_A" or "Time/ms" into a name and a unit.
import { parseUnit, type ParsedUnit } from "./parse-unit";

/** A header cell taken apart. */
export interface ParsedHeader {
  /** The header text as written (trimmed, quotes removed): the channel's name in results. */
  header: string;
  /** The header without its unit part, e.g. "Ia". */
  name: string;
  /** The unit as written, e.g. "mA"; null when the header carries none. */
  unitText: string | null;
  unit: ParsedUnit | null;
}

/**
 * Separates the unit from a header cell. Recognised forms: `name (unit)`, `name [unit]`,
 * `name_unit`, `name/unit`, `name unit` — the unit must be one {@link parseUnit} knows,
 * so "I_a" stays the name of phase a's current.
 *
 * Complexity O(length).
 *
 * @example
 * parseHeader("Ia (A)")  // { header: "Ia (A)", name: "Ia", unitText: "A", unit: { baseUnit: "A", toBase: 1 } }
 * parseHeader("V_L1_kV") // name "V_L1", unitText "kV"
 * parseHeader("I_a")     // name "I_a", unitText null
 */
export function parseHeader(cell: string): ParsedHeader {
  const header = cell.trim().replace(/^"(.*)"$/, "$1").trim();
  const bracketed = /^(.*?)\s*[([]\s*([^)\]]*?)\s*[)\]]\s*$/.exec(header);
  if (bracketed) {
    const unit = parseUnit(bracketed[2] ?? "");
    if (unit) return { header, name: (bracketed[1] ?? "").trim() || header, unitText: bracketed[2] ?? null, unit };
  }
  const suffixed = /^(.+?)[_/\s]+([A-Za-zµμ]{1,7})$/.exec(header);
  if (suffixed) {
    const unit = parseUnit(suffixed[2] ?? "");
    if (unit) return { header, name: (suffixed[1] ?? "").trim(), unitText: suffixed[2] ?? null, unit };
  }
  return { header, name: header, unitText: null, unit: null };
}
