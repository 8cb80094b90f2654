// What counts as an internal name in words meant for a reader (sheet, share page, PDF, CSV): camelCase
// field names, the ids of seeded limit sets, time rules and band conditions, result field names and the
// provenance markers of the seed files. Shared by the unit walk over every seeded limit set and the
// browser walk over the demo sheets.
import { seedLimitSets } from "@/lib/compliance/seed";

const internalIds = [
  ...seedLimitSets().map((s) => s.key),
  ...seedLimitSets().flatMap((s) => (s.content.rules.timeRules ?? []).map((t) => t.id)),
  ...seedLimitSets().flatMap((s) => s.content.bands.flatMap((b) => b.conditions.map((c) => c.id))),
];
const internalWords = ["snapshot", "rowRules", "decidedBy", "context.", "undefined", "NaN", "[object", "null"];
const provenanceMarkers = ["from memory", "(confirmed)", "Ordwise choice", "common practice"];
// Units are the only mixed-case words a reader should meet.
const units = new Set(["mA", "kV", "kVA", "kW", "kWh", "mV", "mW", "kA", "kHz", "mH", "kvar", "Mvar", "MVA"]);

/** The internal names found in a text: camelCase tokens, ids, field names and provenance markers. */
export function internalNames(text: string): string[] {
  const found = new Set<string>();
  for (const m of text.matchAll(/\b[a-z][a-z0-9]*[A-Z][A-Za-z0-9]*\b/g)) if (!units.has(m[0])) found.add(m[0]);
  for (const id of internalIds) if (new RegExp(`(^|[^a-z0-9-])${id}($|[^a-z0-9-])`).test(text)) found.add(id);
  for (const w of [...internalWords, ...provenanceMarkers]) if (text.includes(w)) found.add(w);
  return [...found];
}

