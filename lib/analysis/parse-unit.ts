// Units as they appear in scope, simulator, power-analyser and interval-log exports, mapped to
// SI base units. The one unit parser of the product: waveform headers, units rows and interval logs.

/** What a unit string means: its base unit and the factor from the written unit to it. */
export interface ParsedUnit {
  /** "A", "V", "s", or "%" (percent, e.g. of the fundamental in an interval log). */
  baseUnit: "A" | "V" | "s" | "%";
  /** Multiply a value in the written unit by this to get the base unit (mA → 0.001, min → 60). */
  toBase: number;
}

const PREFIX: Record<string, number> = { "": 1, k: 1e3, m: 1e-3, u: 1e-6, "µ": 1e-6, "μ": 1e-6, n: 1e-9 };

/** Spelled-out units (compared lower case). h and min: SI Brochure, 9th edition (2019), Table 8 (non-SI units accepted for use with the SI). */
const WORDS: Record<string, ParsedUnit> = {
  volt: { baseUnit: "V", toBase: 1 },
  volts: { baseUnit: "V", toBase: 1 },
  amp: { baseUnit: "A", toBase: 1 },
  amps: { baseUnit: "A", toBase: 1 },
  ampere: { baseUnit: "A", toBase: 1 },
  amperes: { baseUnit: "A", toBase: 1 },
  sec: { baseUnit: "s", toBase: 1 },
  secs: { baseUnit: "s", toBase: 1 },
  second: { baseUnit: "s", toBase: 1 },
  seconds: { baseUnit: "s", toBase: 1 },
  usec: { baseUnit: "s", toBase: 1e-6 },
  msec: { baseUnit: "s", toBase: 1e-3 },
  min: { baseUnit: "s", toBase: 60 },
  mins: { baseUnit: "s", toBase: 60 },
  minute: { baseUnit: "s", toBase: 60 },
  minutes: { baseUnit: "s", toBase: 60 },
  h: { baseUnit: "s", toBase: 3600 },
  hr: { baseUnit: "s", toBase: 3600 },
  hrs: { baseUnit: "s", toBase: 3600 },
  hour: { baseUnit: "s", toBase: 3600 },
  hours: { baseUnit: "s", toBase: 3600 },
  "%": { baseUnit: "%", toBase: 1 },
  percent: { baseUnit: "%", toBase: 1 },
};

/**
 * Parses a unit token such as "A", "mA", "kV", "ms", "µs", "min", "h", "%", "(A)", "[V]", "Volt", "sec".
 * Returns null for anything else — including lowercase "a", which names a phase, not amperes,
 * and "Hz", "W", "°C", which are no unit of a current, voltage or time column.
 *
 * Complexity O(length).
 *
 * @example
 * parseUnit("mA")   // { baseUnit: "A", toBase: 0.001 }
 * parseUnit("[kV]") // { baseUnit: "V", toBase: 1000 }
 * parseUnit("min")  // { baseUnit: "s", toBase: 60 }
 * parseUnit("Hz")   // null
 */
export function parseUnit(token: string): ParsedUnit | null {
  const text = token.trim().replace(/^[([{]\s*/, "").replace(/\s*[)\]}]$/, "").trim();
  if (text.length === 0) return null;
  const word = WORDS[text.toLowerCase()];
  if (word) return { ...word };
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
