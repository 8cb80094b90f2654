// Words for the headline numbers: column labels with units and formatted cells, shared by the sheet,
// the share page, the PDF and the CSV so each says the same thing.
import type { IntervalValueStatistics, LoggedStatistic, Quantity } from "@/lib/analysis/types";
import { formatNumber } from "./format";
import type { HeadlineIntervalLog, HeadlineNumbers, HeadlinePower } from "./headline-numbers";
import { formatDurationS, formatUtc } from "./result-wording";

export interface HeadlineColumn {
  key: string;
  /** Label with its unit, e.g. "RMS (A)". */
  label: string;
}

export interface HeadlineRow {
  key: string;
  /** The row's name, e.g. "I1 (phase A)" or "Three-phase total". */
  label: string;
  /** Raw values in the column's unit (CSV); null when not available; "not logged" where an interval log has no column for it. */
  values: Array<number | string | null>;
  /** Display text per column (page and PDF); "—" when not available. */
  cells: string[];
}

export interface HeadlineTable {
  key: string;
  title: string;
  /** What the numbers are taken over, in one sentence (interval logs). */
  caption?: string;
  /** What a row is: "Channel", "Pair" or "Quantity". */
  rowHeader: string;
  /** A list of short statements (what an interval log does not hold) rather than a table of values. */
  list?: boolean;
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

/** The words for a quantity an interval log has no column for. */
export const NOT_LOGGED = "not logged";

/** A logger's per-interval statistic as a cell says it (nothing for the usual interval average). */
const loggedWords: Record<LoggedStatistic, string> = { avg: "", max: "interval maxima", min: "interval minima", p95: "interval 95th percentiles", p99: "interval 99th percentiles", other: "logged values" };

type Statistic = "rmsMean" | "p95" | "max";
const statisticWords: Record<Statistic, string> = { rmsMean: "r.m.s. mean", p95: "95th percentile", max: "maximum" };

/** One statistic of a logged quantity: its value (CSV) and its cell, "not logged" without a column. */
function loggedCell(stats: IntervalValueStatistics | null, statistic: Statistic, digits: number | null, missing = NOT_LOGGED): { value: number | string; cell: string } {
  if (!stats) return { value: missing, cell: missing };
  const value = stats[statistic];
  const text = digits === null ? formatNumber(value) : value.toFixed(digits);
  const of = loggedWords[stats.logged];
  return { value, cell: of ? `${text} (of ${of})` : text };
}

/**
 * An interval log's headline tables: per quantity a row per channel with the logged r.m.s.,
 * fundamental, THD and (currents) TDD as r.m.s. mean, 95th percentile or maximum over the logged
 * intervals, "not logged" where the log has no column; then what the log cannot give at all.
 */
function intervalTables(log: HeadlineIntervalLog, fundamentalHz: number): HeadlineTable[] {
  const tables: HeadlineTable[] = [];
  const caption =
    `Over the ${log.rowCount} logged ${formatDurationS(log.intervalS)} values from ${formatUtc(log.startMs)} to ${formatUtc(log.endMs)}: ` +
    "the mean is the r.m.s. mean (√ of the mean of squares), the 95th percentile by nearest rank; each value is the logger's interval average unless its cell says otherwise.";
  for (const quantity of ["current", "voltage"] as const) {
    const channels = log.channels.filter((c) => c.quantity === quantity);
    if (channels.length === 0) continue;
    const unit = channels[0]!.unit;
    const withTdd = quantity === "current";
    const il = log.ilA !== null ? ` = ${formatNumber(log.ilA)} A` : "";
    const columns: Array<HeadlineColumn & { of: (c: (typeof channels)[number]) => { value: number | string; cell: string } }> = [
      { key: "rmsMean", label: `RMS (${unit}), mean`, of: (c) => loggedCell(c.rms, "rmsMean", null) },
      { key: "rmsMax", label: `RMS (${unit}), maximum`, of: (c) => loggedCell(c.rms, "max", null) },
      { key: "fundamentalRmsMean", label: `Fundamental RMS (${unit}), mean`, of: (c) => loggedCell(c.fundamental, "rmsMean", null) },
      { key: "thdP95", label: "THD (% of fundamental), 95th percentile", of: (c) => loggedCell(c.thdPercent, "p95", 2) },
      { key: "thdMax", label: "THD (% of fundamental), maximum", of: (c) => loggedCell(c.thdPercent, "max", 2) },
      ...(withTdd
        ? [
            { key: "tddP95", label: `TDD (% of IL${il}), 95th percentile`, of: (c: (typeof channels)[number]) => loggedCell(c.tddPercent, "p95", 2, c.distortion && log.ilA === null ? "— (no IL)" : NOT_LOGGED) },
            { key: "tddMax", label: `TDD (% of IL${il}), maximum`, of: (c: (typeof channels)[number]) => loggedCell(c.tddPercent, "max", 2, c.distortion && log.ilA === null ? "— (no IL)" : NOT_LOGGED) },
          ]
        : []),
    ];
    tables.push({
      key: quantity,
      title: `${quantityTitles[quantity]} over the logged period`,
      // Said once, above the first table.
      ...(tables.length === 0 ? { caption } : {}),
      rowHeader: "Channel",
      columns: columns.map(({ key, label }) => ({ key, label })),
      rows: channels.map((c) => {
        const cells = columns.map((column) => column.of(c));
        return { key: c.name, label: c.name, values: cells.map((x) => x.value), cells: cells.map((x) => x.cell) };
      }),
    });
  }
  const absent: Array<[string, string, string]> = [
    ...log.channels.some((c) => c.quantity === "voltage") ? [] : [["voltages", "Voltages (r.m.s., THD)", NOT_LOGGED] as [string, string, string]],
    ["power", "Power (P, S, displacement, distortion and true power factor)", NOT_LOGGED],
    ["frequency", "Fundamental frequency", `${NOT_LOGGED} (the limits use the site's ${formatNumber(fundamentalHz)} Hz)`],
    ["crest-k", "Crest factor, K-factor", `${NOT_LOGGED} (they need the waveform)`],
    ["unbalance", "Unbalance", `${NOT_LOGGED} (needs the phase angles)`],
  ];
  tables.push({
    key: "not-logged",
    title: "Not in this log",
    rowHeader: "Quantity",
    list: true,
    columns: [{ key: "status", label: "In this log" }],
    rows: absent.map(([key, label, cell]) => ({ key, label, values: [cell], cells: [cell] })),
  });
  return tables;
}

/**
 * The headline numbers as labelled tables: one per quantity (currents, then voltages), one for
 * power (V–I pairs and the three-phase total, in W/VA or kW/kVA by size), and one for unbalance.
 * Empty tables are left out. An interval log gets its own tables instead (its logged statistics per
 * quantity, and a table of what the log does not hold, each cell saying "not logged"). Pure; O(channels + pairs).
 *
 * @example
 * headlineTable(h)[0]?.columns[2]?.label // "RMS (A)"
 */
export function headlineTable(h: HeadlineNumbers): HeadlineTable[] {
  if (h.intervalLog) return intervalTables(h.intervalLog, h.fundamentalHz);
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
      rowHeader: "Channel",
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
      rowHeader: "Pair",
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
      rowHeader: "Three-phase set",
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
