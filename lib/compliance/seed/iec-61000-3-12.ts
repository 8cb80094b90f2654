// IEC 61000-3-12 (16 A < I ≤ 75 A per phase) — Tables 2, 3 and 4 of IEC 61000-3-12:2011 (Ed 2.0)
// as bands by phase configuration and minimum Rsce; the set names the consolidated edition
// Ed 2.1 (2011+A1:2021). Table 5 is deliberately absent: its rows could not be checked against the
// standard's text. Markers on each source as in iec-61000-3-2.ts ("confirmed", "secondary source",
// "from memory").
import type { BandInput, LimitSetRevisionContentInput, OrderRowInput, PhaseConfig } from "../model";

const ED = "IEC 61000-3-12:2011";

// Even orders ≤ 12: I_n/Iref ≤ 16/n % in every table (secondary source: an engineering note quoting the standard).
const evenRows: OrderRowInput = {
  from: 2,
  to: 12,
  parity: "even",
  formula: "16/h",
  basis: "%Iref",
  source: `${ED} clause 5 — even harmonics up to order 12 ≤ 16/n % of Iref (secondary source)`,
};

// The "minimum Rsce" rows are lower bounds: a row applies from its Rsce up to the next row's.
const RSCE_RULE =
  "Rows are minimum Rsce values: a row applies for Rsce ≥ its value, so Rsce exactly equal to a row value uses that row.";

interface TableRow {
  rsce: number;
  nextRsce?: number;
  odd: Record<number, number>;
  thc: number;
  pwhc: number;
}

function bandsFor(
  table: string,
  source: string,
  phaseConfig: PhaseConfig[],
  rows: TableRow[],
  extra: Partial<BandInput> = {},
): BandInput[] {
  return rows.map((row) => ({
    label: `${table}, Rsce ${row.nextRsce === undefined ? "≥ " + row.rsce : `${row.rsce}–${row.nextRsce}`}`,
    applicability: {
      rsce: { min: row.rsce, minInclusive: true, max: row.nextRsce, maxInclusive: false, boundaryRule: RSCE_RULE },
      phaseConfig,
    },
    orderRows: [
      ...Object.entries(row.odd).map(([order, percent]) => ({
        from: Number(order),
        to: Number(order),
        limit: percent,
        basis: "%Iref" as const,
        source,
      })),
      evenRows,
    ],
    aggregates: [
      { name: "THC", from: 2, to: 40, basis: "%Iref", limit: row.thc, source },
      { name: "PWHC", from: 14, to: 40, weighting: "order", basis: "%Iref", limit: row.pwhc, source },
    ],
    source,
    ...extra,
  }));
}

// Table 2 — equipment other than balanced three-phase, I_n/Iref % — whole table from memory.
const TABLE_2 = `${ED} Table 2 (other than balanced three-phase) — from memory`;
const table2 = bandsFor("Table 2 (other than balanced three-phase)", TABLE_2, ["single-phase", "other"], [
  { rsce: 33, nextRsce: 66, odd: { 3: 21.6, 5: 10.7, 7: 7.2, 9: 3.8, 11: 3.1, 13: 2 }, thc: 23, pwhc: 23 },
  { rsce: 66, nextRsce: 120, odd: { 3: 24, 5: 13, 7: 8, 9: 5, 11: 4, 13: 3 }, thc: 26, pwhc: 26 },
  { rsce: 120, nextRsce: 250, odd: { 3: 27, 5: 15, 7: 10, 9: 6, 11: 5, 13: 4 }, thc: 30, pwhc: 30 },
  { rsce: 250, nextRsce: 350, odd: { 3: 35, 5: 20, 7: 13, 9: 9, 11: 8, 13: 6 }, thc: 40, pwhc: 40 },
  { rsce: 350, odd: { 3: 41, 5: 24, 7: 15, 9: 12, 11: 10, 13: 8 }, thc: 47, pwhc: 47 },
]);

// Table 3 — balanced three-phase equipment, I_n/Iref % — secondary source, agrees with memory.
// No individual I3/I9 limit for balanced three-phase equipment (secondary source).
const TABLE_3 = `${ED} Table 3 (balanced three-phase) — secondary source`;
const table3 = bandsFor(
  "Table 3 (balanced three-phase)",
  TABLE_3,
  ["balanced-three-phase"],
  [
    { rsce: 33, nextRsce: 66, odd: { 5: 10.7, 7: 7.2, 11: 3.1, 13: 2 }, thc: 13, pwhc: 22 },
    { rsce: 66, nextRsce: 120, odd: { 5: 14, 7: 9, 11: 5, 13: 3 }, thc: 16, pwhc: 25 },
    { rsce: 120, nextRsce: 250, odd: { 5: 19, 7: 12, 11: 7, 13: 4 }, thc: 22, pwhc: 28 },
    { rsce: 250, nextRsce: 350, odd: { 5: 31, 7: 20, 11: 12, 13: 7 }, thc: 37, pwhc: 38 },
    { rsce: 350, odd: { 5: 40, 7: 25, 11: 15, 13: 10 }, thc: 48, pwhc: 46 },
  ],
  { option: { group: "balanced-three-phase", label: "Table 3" } },
);

// Table 4 — balanced three-phase under conditions (a)(b)(c): values from memory; conditions confirmed.
const TABLE_4 = `${ED} Table 4 (balanced three-phase, conditions a/b/c) — from memory`;
const table4 = bandsFor(
  "Table 4 (balanced three-phase, conditions a/b/c)",
  TABLE_4,
  ["balanced-three-phase"],
  [
    { rsce: 33, nextRsce: 120, odd: { 5: 10.7, 7: 7.2, 11: 3.1, 13: 2 }, thc: 13, pwhc: 22 },
    { rsce: 120, odd: { 5: 40, 7: 25, 11: 15, 13: 10 }, thc: 48, pwhc: 46 },
  ],
  {
    option: { group: "balanced-three-phase", label: "Table 4 (conditions a/b/c)" },
    conditions: [
      {
        id: "iec-61000-3-12-table-4-conditions",
        text:
          "One of: (a) I5 and I7 each < 5 % of Iref during the whole observation period; (b) the phase angle of I5 " +
          "has no preferential value over time; (c) the phase angle of I5 relative to the fundamental " +
          "phase-to-neutral voltage stays within 90°–150° during the whole observation period",
        source: `${ED} Table 4 conditions (confirmed)`,
      },
    ],
  },
);

export const iec61000312: LimitSetRevisionContentInput = {
  key: "iec-61000-3-12",
  standard: "IEC 61000-3-12",
  edition: "Ed 2.1 (2011+A1:2021)",
  scope: "Equipment with rated input current > 16 A and ≤ 75 A per phase",
  description:
    "Harmonic current limits in % of Iref by phase configuration and minimum Rsce: Table 2 (other than balanced " +
    "three-phase), Table 3 (balanced three-phase), Table 4 (balanced three-phase meeting condition a, b or c — an " +
    "alternative to Table 3, usable when the condition is asserted). Even orders ≤ 12: 16/n %. THC over orders 2–40, " +
    "PWHC over 14–40. Rsce below 33 is outside the tables (conditional connection). Table 5 (conditions d/e/f) is " +
    "NOT included: its rows could not be checked against the standard's text. Iref defaults to the measured r.m.s. current.",
  quantity: "current",
  notes: [
    "Iref (reference current): the measured r.m.s. current when none is given.",
    "Rsce exactly equal to a row value uses that row; between two rows the limits are interpolated linearly in Rsce (the default; an evaluation may switch it off and use the lower row).",
    "Time rules as IEC 61000-3-2: the average of the 1.5 s smoothed values is compared with the limit and each smoothed value with 150 % of it.",
  ],
  appliesTo:
    "Public LV systems: ≤ 240 V single-phase, ≤ 690 V three-phase, 50/60 Hz; the limits are given for 230/400 V 50 Hz.",
  bands: [...table2, ...table3, ...table4],
  rules: {
    comparison: {
      passAtLimit: true,
      source: `${ED} time aspects as IEC 61000-3-2: average ≤ limit (from memory)`,
    },
    interpolation: {
      variable: "rsce",
      method: "linear",
      defaultOn: true,
      source: `${ED} Tables 2–4 — linear interpolation between successive Rsce values is permitted (secondary source; Table 4 from memory)`,
    },
    timeRules: [
      {
        id: "smoothed-average",
        label: "Average of 1.5 s smoothed values ≤ 100 % of the limit",
        statistic: "mean",
        intervalS: 1.5,
        multiplier: 1,
        // One time constant as the shortest evaluable record (Ordwise choice, as for IEC 61000-3-2).
        minimumDurationS: 1.5,
        appliesTo: "all",
        note: "Orders, THC and PWHC are judged on the observation-period average of their 1.5 s smoothed values (Ordwise reading).",
        source: `${ED} time aspects as IEC 61000-3-2: average of the 1.5 s smoothed values ≤ limit (from memory)`,
      },
      {
        id: "smoothed-max",
        label: "Every 1.5 s smoothed value ≤ 150 % of the limit",
        statistic: "max",
        intervalS: 1.5,
        multiplier: 1.5,
        minimumDurationS: 1.5,
        appliesTo: "orders",
        source: `${ED} time aspects as IEC 61000-3-2: each 1.5 s smoothed value ≤ 150 % of the limit (from memory)`,
      },
    ],
  },
};

export const iec61000312LimitSets = [{ name: "IEC 61000-3-12 (16–75 A)", content: iec61000312 }];
