// Finds the sample interval (or rate) in the key/value lines some instruments write above the header.
import type { PreambleEntry } from "./detect-layout";
import { parseNumber } from "./parse-number";

const INTERVAL_KEY = /sampl\w*\s*(interval|period|time)|x[\s_-]*incr\w*|time[\s_-]*(step|resolution|interval|increment|per[\s_-]*(point|sample))|^\s*(dt|delta[\s_-]*t|interval)\b|horiz\w*[\s_-]*(interval|resolution|scale[\s_-]*per[\s_-]*point)/i;
const RATE_KEY = /sampl\w*\s*(rate|freq\w*)|^\s*(fs|sample[\s_-]*rate|samples?[\s_-]*per[\s_-]*s\w*)\b|acquisition[\s_-]*rate/i;
const TIME_UNITS: Record<string, number> = { s: 1, sec: 1, ms: 1e-3, us: 1e-6, "µs": 1e-6, "μs": 1e-6, ns: 1e-9 };
const RATE_UNITS: Record<string, number> = {
  hz: 1, khz: 1e3, mhz: 1e6, "s/s": 1, "sa/s": 1, sps: 1, "ks/s": 1e3, "ksa/s": 1e3, ksps: 1e3, "ms/s": 1e6, "msa/s": 1e6, msps: 1e6,
};

function splitValue(text: string, decimalComma: boolean): { value: number; unit: string } | null {
  const match = /^\s*([-+]?[0-9][0-9.,]*(?:[eE][-+]?[0-9]+)?)\s*([A-Za-zµμ/]*)\s*$/.exec(text);
  if (!match) return null;
  const value = parseNumber(match[1]!, decimalComma || !match[1]!.includes("."));
  return Number.isNaN(value) || value <= 0 ? null : { value, unit: match[2] ?? "" };
}

function unitInKey(key: string): string {
  const match = /[([]\s*([^)\]]+?)\s*[)\]]/.exec(key);
  return match ? match[1]! : "";
}

/**
 * Returns the sample interval in seconds stated in the preamble, from an interval key
 * ("Sample Interval", "X Increment", "dt", …; unit s/ms/µs in the value or the key, default s)
 * or a rate key ("Sample Rate", "Sampling frequency", "fs"; Hz, kHz, S/s, kS/s, MS/s; default Hz).
 * Null when the preamble states neither.
 *
 * Complexity O(preamble length).
 *
 * @example
 * intervalFromPreamble([{ key: "Sample Rate", value: "25.6 kS/s", line: 2 }], false) // { sampleIntervalS: 3.90625e-5, line: 2 }
 */
export function intervalFromPreamble(
  preamble: readonly PreambleEntry[],
  decimalComma: boolean,
): { sampleIntervalS: number; line: number; key: string } | null {
  for (const entry of preamble) {
    const isInterval = INTERVAL_KEY.test(entry.key);
    const isRate = !isInterval && RATE_KEY.test(entry.key);
    if (!isInterval && !isRate) continue;
    const parsed = splitValue(entry.value.replace(/\s+/g, " ").split(" ").slice(0, 2).join(" "), decimalComma);
    if (!parsed) continue;
    const unit = (parsed.unit || unitInKey(entry.key)).toLowerCase();
    if (isInterval) {
      const factor = unit === "" ? 1 : TIME_UNITS[unit] ?? TIME_UNITS[unit.replace(/^u/, "µ")];
      if (factor !== undefined) return { sampleIntervalS: parsed.value * factor, line: entry.line, key: entry.key };
    } else {
      const factor = unit === "" ? 1 : RATE_UNITS[unit];
      if (factor !== undefined) return { sampleIntervalS: 1 / (parsed.value * factor), line: entry.line, key: entry.key };
    }
  }
  return null;
}
