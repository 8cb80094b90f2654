// A clamp's, probe's, shunt's or instrument transformer's rating, written as on its label, turned
// into the scale factor the import multiplies the recorded values by.
import { parseUnit } from "./parse-unit";
import type { Quantity } from "./types";

/** A rating read: the scale (A or V at the primary per A or V recorded), or why it cannot be read. */
export type SensorRating =
  | { ok: true; scale: number; /** What was understood, e.g. "10 mV/A → ×100 (A per V recorded)". */ explanation: string }
  | { ok: false; message: string };

const SHUNT = /^(m|k|u|µ|μ)?(Ω|ohm|ohms)$/i;
const SHUNT_PREFIX: Record<string, number> = { "": 1, m: 1e-3, k: 1e3, u: 1e-6, "µ": 1e-6, "μ": 1e-6 };

function number(text: string): number {
  const t = text.trim().replace(",", ".");
  return /^[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?$/i.test(t) ? Number(t) : Number.NaN;
}

const fail = (message: string): SensorRating => ({ ok: false, message });

/**
 * Reads a sensor rating or a plain scale factor. Accepted forms:
 * - a plain number: the scale itself ("40", "2.5");
 * - a multiplier or ratio: "x10", "×10", "100:5" (a CT: 20), "100:1" (a probe: 100);
 * - output per input, as on a clamp or probe label: "10 mV/A" (→ 100 A per V recorded), "0.1 V/A",
 *   "10 mV/V"; input per output: "100 A/V", "1000 V/V"; also "per" for "/" and "100 A / 5 A";
 * - a shunt: "10 mΩ" (→ 100 A per V).
 * Ratios of the same base unit (A/A, V/V, a:b) are read as attenuation: a probe or transformer
 * never amplifies the quantity it measures, so a value below 1 is its output per input and is
 * inverted (common practice, no source). Unit prefixes as in {@link parseUnit}.
 * With `quantity`, a rating for the other quantity (a V/V rating on a current) is refused.
 *
 * Complexity O(length).
 *
 * @example
 * parseSensorRating("10 mV/A")  // { ok: true, scale: 100, explanation: "10 mV/A → ×100 (A per V recorded)" }
 * parseSensorRating("100:5")    // { ok: true, scale: 20, … }
 * parseSensorRating("-2")       // { ok: false, message: "a scale must be greater than zero…" }
 */
export function parseSensorRating(text: string, quantity?: Quantity): SensorRating {
  const raw = text.trim();
  if (raw === "") return fail("give a scale factor or the sensor's rating (e.g. 40, 100:5, 10 mV/A)");
  let scale: number;
  let per: string;
  const plain = number(raw);
  const multiplier = /^(?:[x×*]\s*([^x×*]+)|([^x×*]+?)\s*[x×])$/i.exec(raw);
  const ratio = /^([^:]+):([^:]+)$/.exec(raw);
  const units = /^([+-]?[\d.,eE+-]*\d\.?)\s*([^\s/\d][^/]*?)?\s*(?:\/|\s+per\s+)\s*([\d.,]*\d\.?)?\s*([^\s/\d][^/]*?)$/i.exec(raw);
  const shunt = /^([+-]?[\d.,eE+-]*\d\.?)\s*(\S+)$/.exec(raw);
  if (!Number.isNaN(plain)) {
    scale = plain;
    per = "per unit recorded";
  } else if (multiplier) {
    scale = number(multiplier[1] ?? multiplier[2] ?? "");
    per = "per unit recorded";
  } else if (ratio) {
    const a = number(ratio[1]!);
    const b = number(ratio[2]!);
    if (Number.isNaN(a) || Number.isNaN(b)) return fail(`cannot read "${raw}" as a ratio: write it as two numbers, e.g. 100:5`);
    if (!(a > 0 && b > 0)) return fail(`a ratio needs two numbers greater than zero, got "${raw}"`);
    scale = a / b < 1 ? b / a : a / b;
    per = "per unit recorded";
  } else if (shunt && SHUNT.test(shunt[2]!)) {
    const ohms = number(shunt[1]!) * SHUNT_PREFIX[(SHUNT.exec(shunt[2]!)![1] ?? "").replace("U", "u")]!;
    if (!(ohms > 0)) return fail(`a shunt's resistance must be greater than zero, got "${raw}"`);
    if (quantity === "voltage") return fail(`"${raw}" is a shunt: it measures a current, but this column is a voltage`);
    scale = 1 / ohms;
    per = "A per V recorded";
  } else if (units) {
    const top = number(units[1]!);
    const bottom = units[3] ? number(units[3]) : 1;
    const topUnit = parseUnit(units[2] ?? "");
    const bottomUnit = parseUnit(units[4]!);
    if (Number.isNaN(top) || Number.isNaN(bottom)) return fail(`cannot read the numbers of "${raw}"`);
    if (!topUnit || !bottomUnit || topUnit.baseUnit === "s" || topUnit.baseUnit === "%" || bottomUnit.baseUnit === "s" || bottomUnit.baseUnit === "%") {
      return fail(`cannot read "${raw}": write the rating in A and V with their prefixes, e.g. 10 mV/A, 100 A/V, 100:5`);
    }
    if (!(top > 0 && bottom > 0)) return fail(`a rating must be greater than zero, got "${raw}"`);
    const value = (top * topUnit.toBase) / (bottom * bottomUnit.toBase);
    const measured: Quantity = topUnit.baseUnit === bottomUnit.baseUnit ? (topUnit.baseUnit === "A" ? "current" : "voltage") : "current";
    if (quantity && quantity !== measured) {
      return fail(`"${raw}" is the rating of a ${measured} sensor, but this column is a ${quantity}`);
    }
    if (topUnit.baseUnit === bottomUnit.baseUnit) {
      scale = value < 1 ? 1 / value : value;
      per = `${topUnit.baseUnit} per ${topUnit.baseUnit} recorded`;
    } else if (topUnit.baseUnit === "V") {
      // Output per measured ampere (a clamp's sensitivity): the scale is its inverse.
      scale = 1 / value;
      per = "A per V recorded";
    } else {
      scale = value;
      per = "A per V recorded";
    }
  } else {
    return fail(`cannot read "${raw}" as a scale or a sensor rating (e.g. 40, x10, 100:5, 10 mV/A, 100 A/V, 10 mΩ)`);
  }
  if (Number.isNaN(scale)) return fail(`cannot read "${raw}" as a scale or a sensor rating (e.g. 40, x10, 100:5, 10 mV/A)`);
  if (!(scale > 0) || !Number.isFinite(scale)) {
    return fail(`a scale must be greater than zero (it multiplies the recorded values; zero would erase them and a negative one invert them), got "${raw}"`);
  }
  const shown = Number(scale.toPrecision(12));
  return { ok: true, scale: shown, explanation: raw === String(shown) ? `×${shown} (${per})` : `${raw} → ×${shown} (${per})` };
}
