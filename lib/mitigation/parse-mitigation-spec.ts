import { MitigationInputError } from "./mitigation-input-error";
import type { Mitigation } from "./types";

/** Residual imbalance between the bridges of a multi-pulse conversion when none is stated, %. */
export const DEFAULT_IMBALANCE_PERCENT = 2;
/** Quality factor of a passive filter's reactor when none is stated (typical 20–100; common practice). */
export const DEFAULT_FILTER_Q = 30;

const number = (text: string, what: string, spec: string): number => {
  const value = Number(text);
  if (text.trim() === "" || !Number.isFinite(value)) throw new MitigationInputError(`mitigation "${spec}": ${what} "${text}" is not a number`);
  return value;
};

/**
 * Parses one mitigation of the command line: `reactor=3%`, `dc-choke=4%`, `pulses=12` (or 18,
 * optional `,imbalance=2%`), `filter=4.7@300kvar` (optional `,q=30`), `active=100A` (optional
 * `,orders=2-25`). Throws a one-line message naming the problem.
 *
 * @example parseMitigationSpec("filter=4.7@300kvar,q=40") // { kind: "passive-filter", tuningOrder: 4.7, kvar: 300, q: 40 }
 */
export function parseMitigationSpec(spec: string): Mitigation {
  const eq = spec.indexOf("=");
  if (eq < 0) throw new MitigationInputError(`mitigation "${spec}": expected KIND=VALUE (reactor=3%, dc-choke=4%, pulses=12, filter=4.7@300kvar, active=100A)`);
  const kind = spec.slice(0, eq).trim().toLowerCase();
  const [main = "", ...options] = spec.slice(eq + 1).split(",");
  const opts = new Map<string, string>();
  for (const o of options) {
    const k = o.indexOf("=");
    if (k < 0) throw new MitigationInputError(`mitigation "${spec}": option "${o}" should be NAME=VALUE`);
    opts.set(o.slice(0, k).trim().toLowerCase(), o.slice(k + 1).trim());
  }
  const known = (allowed: string[]): void => {
    for (const k of opts.keys()) if (!allowed.includes(k)) throw new MitigationInputError(`mitigation "${spec}": unknown option "${k}"`);
  };
  const percent = (text: string, what: string): number => {
    const t = text.trim();
    const value = number(t.endsWith("%") ? t.slice(0, -1) : t, what, spec);
    if (value < 0 || value > 100) throw new MitigationInputError(`mitigation "${spec}": ${what} must be between 0 and 100 %`);
    return value;
  };
  switch (kind) {
    case "reactor":
    case "dc-choke": {
      known([]);
      const p = percent(main, kind === "reactor" ? "reactor impedance" : "DC choke");
      if (p <= 0 || p > 20) throw new MitigationInputError(`mitigation "${spec}": ${kind} must be above 0 and at most 20 %`);
      return { kind, percent: p };
    }
    case "pulses": {
      known(["imbalance"]);
      const pulses = number(main, "pulse number", spec);
      if (pulses !== 12 && pulses !== 18) throw new MitigationInputError(`mitigation "${spec}": pulses must be 12 or 18`);
      const imbalance = opts.has("imbalance") ? percent(opts.get("imbalance")!, "imbalance") : DEFAULT_IMBALANCE_PERCENT;
      return { kind: "multi-pulse", pulses, imbalancePercent: imbalance };
    }
    case "filter": {
      known(["q"]);
      const m = /^\s*([^@]+)@\s*([^\s]+?)\s*kvar\s*$/i.exec(main);
      if (!m) throw new MitigationInputError(`mitigation "${spec}": expected filter=ORDER@KVARkvar, e.g. filter=4.7@300kvar`);
      const tuningOrder = number(m[1]!.trim(), "tuning order", spec);
      const kvar = number(m[2]!, "kvar", spec);
      if (tuningOrder <= 1 || tuningOrder > 50) throw new MitigationInputError(`mitigation "${spec}": tuning order must be above 1 and at most 50`);
      if (kvar <= 0) throw new MitigationInputError(`mitigation "${spec}": kvar must be positive`);
      const q = opts.has("q") ? number(opts.get("q")!, "q", spec) : DEFAULT_FILTER_Q;
      if (q <= 0) throw new MitigationInputError(`mitigation "${spec}": q must be positive`);
      return { kind: "passive-filter", tuningOrder, kvar, q };
    }
    case "active": {
      known(["orders"]);
      const m = /^\s*([^\s]+?)\s*A\s*$/.exec(main);
      if (!m) throw new MitigationInputError(`mitigation "${spec}": expected active=RATINGA, e.g. active=100A`);
      const ratingA = number(m[1]!, "rating", spec);
      if (ratingA <= 0) throw new MitigationInputError(`mitigation "${spec}": rating must be positive`);
      let fromOrder = 2;
      let toOrder = 50;
      if (opts.has("orders")) {
        const r = /^(\d+)-(\d+)$/.exec(opts.get("orders")!);
        if (!r) throw new MitigationInputError(`mitigation "${spec}": orders should be FROM-TO, e.g. orders=2-25`);
        fromOrder = Number(r[1]);
        toOrder = Number(r[2]);
        if (fromOrder < 2 || toOrder > 50 || fromOrder > toOrder) throw new MitigationInputError(`mitigation "${spec}": orders must lie within 2-50`);
      }
      return { kind: "active-filter", ratingA, fromOrder, toOrder };
    }
    default:
      throw new MitigationInputError(`mitigation "${spec}": unknown kind "${kind}" (reactor, dc-choke, pulses, filter, active)`);
  }
}
