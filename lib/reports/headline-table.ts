// Words for the headline numbers: column labels with units and formatted cells, shared by the sheet,
// the share page, the PDF and the CSV so each says the same thing.
import type { Quantity } from "@/lib/analysis/types";
import { formatNumber } from "./format";
import type { HeadlineNumbers, HeadlinePower } from "./headline-numbers";

export interface HeadlineColumn {
  key: string;
  /** Label with its unit, e.g. "RMS (A)". */
  label: string;
}

export interface HeadlineRow {
  key: string;
  /** The row's name, e.g. "I1 (phase A)" or "Three-phase total". */
  label: string;
  /** Raw values in the column's unit (CSV); null when not available. */
  values: Array<number | null>;
  /** Display text per column (page and PDF); "—" when not available. */
  cells: string[];
}

export interface HeadlineTable {
  key: string;
  title: string;
  columns: HeadlineColumn[];
  rows: HeadlineRow[];
}

const quantityTitles: Record<Quantity, string> = { current: "Currents", voltage: "Voltages" };

function channelLabel(name: string, phase: string | null): string {
  return phase ? `${name} (phase ${phase.toUpperCase()})` : name;
}

function pairLabel(p: HeadlinePower): string {
  if (p.kind === "total") return "Three-phase total";
  return `${p.voltage ?? "?"} × ${p.current ?? "?"}${p.phase ? ` (phase ${p.phase.toUpperCase()})` : ""}`;
}

const fixed = (x: number | null, digits: number) => (x === null ? "—" : x.toFixed(digits));

/**
 * The headline numbers as labelled tables: one per quantity (currents, then voltages), one for
 * power (V–I pairs and the three-phase total, in W/VA or kW/kVA by size), and one for unbalance.
 * Empty tables are left out. Pure; O(channels + pairs).
 *
 * @example
 * headlineTable(h)[0]?.columns[2]?.label // "RMS (A)"
 */
export function headlineTable(h: HeadlineNumbers): HeadlineTable[] {
  const tables: HeadlineTable[] = [];
  for (const quantity of ["current", "voltage"] as const) {
    const channels = h.channels.filter((c) => c.quantity === quantity);
    if (channels.length === 0) continue;
    const unit = channels[0]!.unit;
    const withTdd = quantity === "current" && channels.some((c) => c.tddPercent !== null);
    // One upper order and one IL for every channel (the usual case) go in the label, keeping the cells short.
    const orders = new Set(channels.map((c) => c.thdMaxOrder));
    const thdOrder = orders.size === 1 ? [...orders][0] ?? null : null;
    const ils = new Set(channels.filter((c) => c.tddPercent !== null).map((c) => c.ilA));
    const il = ils.size === 1 ? [...ils][0] ?? null : null;
    const columns: HeadlineColumn[] = [
      { key: "fundamentalHz", label: "Fundamental frequency (Hz)" },
      { key: "rms", label: `RMS (${unit})` },
      { key: "fundamentalRms", label: `Fundamental RMS (${unit})` },
      { key: "thdPercent", label: thdOrder !== null ? `THD h2–h${thdOrder} (% of fundamental)` : "THD (% of fundamental)" },
      ...(withTdd ? [{ key: "tddPercent", label: il !== null ? `TDD (% of IL = ${formatNumber(il)} A)` : "TDD (% of IL)" }] : []),
      { key: "crestFactor", label: "Crest factor" },
      { key: "kFactor", label: "K-factor" },
    ];
    tables.push({
      key: quantity,
      title: quantityTitles[quantity],
      columns,
      rows: channels.map((c) => {
        const values: Array<number | null> = [c.fundamentalHz, c.rms, c.fundamentalRms, c.thdPercent, ...(withTdd ? [c.tddPercent] : []), c.crestFactor, c.kFactor];
        const cells = [
          fixed(c.fundamentalHz, 3),
          formatNumber(c.rms),
          formatNumber(c.fundamentalRms),
          c.thdPercent === null ? "—" : thdOrder !== null ? c.thdPercent.toFixed(2) : `${c.thdPercent.toFixed(2)} (h2–h${c.thdMaxOrder ?? "?"})`,
          ...(withTdd ? [c.tddPercent === null ? "— (no IL)" : il !== null ? c.tddPercent.toFixed(2) : `${c.tddPercent.toFixed(2)} (IL ${formatNumber(c.ilA)} A)`] : []),
          fixed(c.crestFactor, 2),
          fixed(c.kFactor, 2),
        ];
        return { key: c.name, label: channelLabel(c.name, c.phase), values, cells };
      }),
    });
  }

  if (h.power.length > 0) {
    const kilo = h.power.some((p) => Math.abs(p.apparentPowerVA) >= 1000);
    const scale = kilo ? 1000 : 1;
    tables.push({
      key: "power",
      title: "Power",
      columns: [
        { key: "activePower", label: kilo ? "P (kW)" : "P (W)" },
        { key: "apparentPower", label: kilo ? "S (kVA)" : "S (VA)" },
        { key: "displacementFactor", label: "Displacement factor" },
        { key: "distortionFactor", label: "Distortion factor" },
        { key: "truePowerFactor", label: "True power factor" },
      ],
      rows: h.power.map((p) => ({
        key: p.kind === "total" ? "total" : `${p.voltage}|${p.current}`,
        label: pairLabel(p),
        values: [p.activePowerW / scale, p.apparentPowerVA / scale, p.displacementFactor, p.distortionFactor, p.truePowerFactor],
        cells: [
          formatNumber(p.activePowerW / scale),
          formatNumber(p.apparentPowerVA / scale),
          p.displacementFactor === null ? "—" : `${p.displacementFactor.toFixed(3)}${p.leadLag ? ` ${p.leadLag}` : ""}`,
          fixed(p.distortionFactor, 3),
          fixed(p.truePowerFactor, 3),
        ],
      })),
    });
  }

  if (h.unbalance.length > 0) {
    tables.push({
      key: "unbalance",
      title: "Unbalance",
      columns: [{ key: "unbalancePercent", label: "Fundamental unbalance (negative / positive sequence, %)" }],
      rows: h.unbalance.map((u) => ({
        key: `${u.quantity}-unbalance`,
        label: `${quantityTitles[u.quantity]} ${u.channels.join(", ")}`,
        values: [u.unbalancePercent],
        cells: [u.unbalancePercent.toFixed(2)],
      })),
    });
  }
  return tables;
}
