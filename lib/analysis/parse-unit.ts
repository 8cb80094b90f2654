// Units as they appear in scope and power-analyser exports, mapped to SI base units.

/** What a unit string means: its base unit and the factor from the written unit to it. */
export interface ParsedUnit {
  /** "A", "V" or "s". */
  baseUnit: "A" | "V" | "s";
  /** Multiply a value in the written unit by this to get the base unit (mA → 0.001). */
  toBase: number;
}

const PREFIX: Record<string, number> = { "": 1, k: 1e3, m: 1e-3, u: 1e-6, "µ": 1e-6, "μ": 1e-6, n: 1e-9 };

/**
 * Parses a unit token such as "A", "mA", "kV", "ms", "µs", "(A)", "[V]", "Volt", "sec".
 * Returns null for anything else (including lowercase "a", which names a phase, not amperes).
 *
 * Complexity O(length).
 *
 * @example
 * parseUnit("mA")   // { baseUnit: "A", toBase: 0.001 }
 * parseUnit("[kV]") // { baseUnit: "V", toBase: 1000 }
 * parseUnit("Hz")   // null
 */
export function parseUnit(token: string): ParsedUnit | null {
  const text = token.trim().replace(/^[([{]\s*/, "").replace(/\s*[)\]}]$/, "").trim();
  if (text.length === 0) return null;
  const lower = text.toLowerCase();
  if (lower === "volt" || lower === "volts") return { baseUnit: "V", toBase: 1 };
  if (lower === "amp" || lower === "amps" || lower === "ampere" || lower === "amperes") return { baseUnit: "A", toBase: 1 };
  if (lower === "sec" || lower === "secs" || lower === "second" || lower === "seconds") return { baseUnit: "s", toBase: 1 };
  if (lower === "usec") return { baseUnit: "s", toBase: 1e-6 };
  if (lower === "msec") return { baseUnit: "s", toBase: 1e-3 };
  const match = /^(k|m|u|µ|μ|n)?(A|V|s)$/.exec(text);
  if (!match) return null;
  const prefix = match[1] ?? "";
  const base = match[2] as "A" | "V" | "s";
  const factor = PREFIX[prefix];
  if (factor === undefined) return null;
  // kilo-seconds and nano-amperes do not occur in these exports; "ks" or "nA" more likely mean something else.
  if (base === "s" && prefix === "k") return null;
  if (base !== "s" && prefix === "n") return null;
  return { baseUnit: base, toBase: factor };
}
