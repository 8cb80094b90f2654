// IEEE 519 — current distortion limits (IEEE Std 519-2014 Tables 2, 3, 4 and the IEEE Std 519-2022
// even-harmonic rule) and voltage distortion limits (IEEE Std 519-2014 Table 1, unchanged in 2022),
// with the statistical evaluation of IEEE Std 519-2014 §5.2. Markers on each source as in
// iec-61000-3-2.ts ("confirmed", "from memory", "Ordwise choice" / "Ordwise reading").
import type { BandInput, LimitSetRevisionContentInput, OrderRowInput, RangeInput, TimeRuleInput } from "../model";

// The printed tables head the rows "< 20", "20 < 50", "50 < 100", … without assigning a value
// exactly at a bound. Ordwise's choice, stated in the data and quoted by the evaluator:
const ISC_IL_RULE =
  "Printed rows (\"20 < 50\") leave exact bounds unassigned; Ordwise reads each row as lower ≤ Isc/IL < upper, " +
  "so the lower row applies only when Isc/IL is strictly below its upper bound and a value exactly at a bound " +
  "uses the higher row (common practice, from memory).";

/** How a value exactly on an Isc/IL row boundary is read (the interpretation, in plain words for the sheet). */
const ISC_IL_NOTE =
  "Isc/IL exactly on a row boundary (e.g. 20, 50, 100 or 1000 in Table 2) uses the higher row: each row is read as lower ≤ Isc/IL < upper.";
const H2_NOTE = "Order 2 lies below the printed 3 ≤ h < 11 range; it is judged against that range's limit, reduced as for the other even orders.";
const CURRENT_TIME_NOTE =
  "Time-varying harmonics: the daily 99th percentile of 3 s values is compared with 2 × the table limit and the weekly " +
  "99th percentile of 10 min values with 1.5 × and their weekly 95th percentile with 1.0 × the table limit; each must stay below it.";

/** Odd-order ranges of Tables 2–4: 3 ≤ h < 11, 11 ≤ h < 17, 17 ≤ h < 23, 23 ≤ h < 35, 35 ≤ h ≤ 50. */
const ODD_RANGES: Array<[number, number]> = [
  [3, 9],
  [11, 15],
  [17, 21],
  [23, 33],
  [35, 49],
];

interface CurrentTableRow {
  label: string;
  iscOverIl: RangeInput;
  /** % of IL for the five odd ranges. */
  odd: [number, number, number, number, number];
  tddPercent: number;
  generator?: boolean;
}

interface CurrentTable {
  name: string;
  busVoltageV: RangeInput;
  source: string;
  rows: CurrentTableRow[];
}

const round6 = (x: number): number => Math.round(x * 1e6) / 1e6;

/**
 * Even-order rows for one Isc/IL row. Evens 2–10 use the first odd range's limit — h = 2 is
 * below the printed "3 ≤ h < 11" range; including it there is Ordwise's choice (common practice).
 */
type EvenRule = (h: number) => { factor: number; note: string };

function currentBands(table: CurrentTable, evenRule: EvenRule, evenSource: string): BandInput[] {
  return table.rows.map((row) => {
    const orderRows: OrderRowInput[] = ODD_RANGES.map(([from, to], i) => ({
      from,
      to,
      parity: "odd",
      limit: row.odd[i],
      basis: "%IL",
      source: table.source,
    }));
    const evenRanges: Array<[number, number, number]> = [
      [2, 10, row.odd[0]],
      [12, 16, row.odd[1]],
      [18, 22, row.odd[2]],
      [24, 34, row.odd[3]],
      [36, 50, row.odd[4]],
    ];
    for (const [from, to, oddLimit] of evenRanges) {
      // Split a range where the even rule's factor changes (2022: h ≤ 6 vs h > 6).
      let start = from;
      for (let h = from; h <= to; h += 2) {
        const next = h + 2;
        if (next > to || evenRule(next).factor !== evenRule(h).factor) {
          const { factor, note } = evenRule(h);
          orderRows.push({
            from: start,
            to: h,
            parity: "even",
            limit: round6(oddLimit * factor),
            basis: "%IL",
            note: `${note} (${oddLimit} % × ${factor}, computed from formula)${start === 2 ? "; h = 2 grouped with 3 ≤ h < 11 (Ordwise choice)" : ""}`,
            source: evenSource,
          });
          start = next;
        }
      }
    }
    return {
      label: `${table.name}, ${row.label}`,
      applicability: {
        busVoltageV: table.busVoltageV,
        iscOverIl: { ...row.iscOverIl, boundaryRule: ISC_IL_RULE },
      },
      generatorBand: row.generator,
      orderRows,
      aggregates: [{ name: "TDD", from: 2, to: 50, basis: "%IL", limit: row.tddPercent, source: table.source }],
      source: table.source,
    };
  });
}

const lt = (max: number): RangeInput => ({ min: 0, minInclusive: true, max, maxInclusive: false });
const between = (min: number, max: number): RangeInput => ({ min, minInclusive: true, max, maxInclusive: false });
const atLeast = (min: number): RangeInput => ({ min, minInclusive: true });

function currentTables(edition: string): CurrentTable[] {
  return [
    {
      // Table 2 — 120 V through 69 kV (confirmed; same numbers as 1992 Table 10.3). h ≤ 50 (confirmed).
      name: "Table 2 (120 V–69 kV)",
      busVoltageV: { min: 120, minInclusive: true, max: 69_000, maxInclusive: true },
      source: `${edition} Table 2`,
      rows: [
        { label: "Isc/IL < 20", iscOverIl: lt(20), odd: [4.0, 2.0, 1.5, 0.6, 0.3], tddPercent: 5.0, generator: true },
        { label: "20 ≤ Isc/IL < 50", iscOverIl: between(20, 50), odd: [7.0, 3.5, 2.5, 1.0, 0.5], tddPercent: 8.0 },
        { label: "50 ≤ Isc/IL < 100", iscOverIl: between(50, 100), odd: [10.0, 4.5, 4.0, 1.5, 0.7], tddPercent: 12.0 },
        { label: "100 ≤ Isc/IL < 1000", iscOverIl: between(100, 1000), odd: [12.0, 5.5, 5.0, 2.0, 1.0], tddPercent: 15.0 },
        { label: "Isc/IL ≥ 1000", iscOverIl: atLeast(1000), odd: [15.0, 7.0, 6.0, 2.5, 1.4], tddPercent: 20.0 },
      ],
    },
    {
      // Table 3 — above 69 kV through 161 kV — from memory.
      name: "Table 3 (69–161 kV)",
      busVoltageV: { min: 69_000, minInclusive: false, max: 161_000, maxInclusive: true },
      source: `${edition} Table 3 (from memory)`,
      rows: [
        { label: "Isc/IL < 20", iscOverIl: lt(20), odd: [2.0, 1.0, 0.75, 0.3, 0.15], tddPercent: 2.5, generator: true },
        { label: "20 ≤ Isc/IL < 50", iscOverIl: between(20, 50), odd: [3.5, 1.75, 1.25, 0.5, 0.25], tddPercent: 4.0 },
        { label: "50 ≤ Isc/IL < 100", iscOverIl: between(50, 100), odd: [5.0, 2.25, 2.0, 0.75, 0.35], tddPercent: 6.0 },
        { label: "100 ≤ Isc/IL < 1000", iscOverIl: between(100, 1000), odd: [6.0, 2.75, 2.5, 1.0, 0.5], tddPercent: 7.5 },
        { label: "Isc/IL ≥ 1000", iscOverIl: atLeast(1000), odd: [7.5, 3.5, 3.0, 1.25, 0.7], tddPercent: 10.0 },
      ],
    },
    {
      // Table 4 — above 161 kV — from memory.
      name: "Table 4 (> 161 kV)",
      busVoltageV: { min: 161_000, minInclusive: false },
      source: `${edition} Table 4 (from memory)`,
      rows: [
        { label: "Isc/IL < 25", iscOverIl: lt(25), odd: [1.0, 0.5, 0.38, 0.15, 0.1], tddPercent: 1.5, generator: true },
        { label: "25 ≤ Isc/IL < 50", iscOverIl: between(25, 50), odd: [2.0, 1.0, 0.75, 0.3, 0.15], tddPercent: 2.5 },
        { label: "Isc/IL ≥ 50", iscOverIl: atLeast(50), odd: [3.0, 1.5, 1.15, 0.45, 0.22], tddPercent: 3.75 },
      ],
    },
  ];
}

const DAY_S = 86_400;
const WEEK_S = 604_800;

/**
 * IEEE 519 statistical evaluation of currents (IEEE Std 519-2014 §5.2; accumulation periods confirmed, multipliers from memory):
 * daily 99th percentile of 3 s values < 2.0 ×, weekly 99th percentile of 10 min values < 1.5 ×,
 * weekly 95th percentile of 10 min values < 1.0 × the Table 2–4 values; per order (% of IL) and TDD.
 * Minimum record: one complete 3 s value / one complete 10-minute interval (Ordwise choice); a
 * shorter record than a day / week is evaluated over what it has, with a note.
 */
function currentTimeRules(edition: string, editionNote: string): TimeRuleInput[] {
  const clause = `${edition} §5.2 (statistical evaluation)${editionNote}`;
  return [
    {
      id: "daily-p99-very-short",
      label: "Daily 99th percentile of 3 s values < 2.0 × limit",
      statistic: "percentile",
      percentile: 99,
      intervalS: 3,
      multiplier: 2.0,
      accumulationS: DAY_S,
      minimumDurationS: 3,
      appliesTo: "all",
      passAtLimit: false,
      source: `${clause} — very short time (3 s) values accumulated over 24 h: 99th percentile < 2.0 × Table 2–4 limits (from memory)`,
    },
    {
      id: "weekly-p99-short",
      label: "Weekly 99th percentile of 10 min values < 1.5 × limit",
      statistic: "percentile",
      percentile: 99,
      intervalS: 600,
      multiplier: 1.5,
      accumulationS: WEEK_S,
      minimumDurationS: 600,
      appliesTo: "all",
      passAtLimit: false,
      source: `${clause} — short time (10 min) values accumulated over 7 days: 99th percentile < 1.5 × Table 2–4 limits (from memory)`,
    },
    {
      id: "weekly-p95-short",
      label: "Weekly 95th percentile of 10 min values < 1.0 × limit",
      statistic: "percentile",
      percentile: 95,
      intervalS: 600,
      multiplier: 1.0,
      accumulationS: WEEK_S,
      minimumDurationS: 600,
      appliesTo: "all",
      passAtLimit: false,
      source: `${clause} — short time (10 min) values accumulated over 7 days: 95th percentile < 1.0 × Table 2–4 limits (from memory)`,
    },
  ];
}

const CURRENT_APPLIES_TO =
  "Current at the point of common coupling (PCC) of a user's installation, in % of IL (maximum demand load " +
  "current, fundamental, at the PCC). Context needed: bus voltage, Isc and IL. Power-generation equipment is " +
  "limited to the first row regardless of Isc/IL (note c). Current distortion causing a DC offset is not allowed " +
  "(note b; not checked).";

// 2014 note (a): even harmonics limited to 25 % of the odd limit of the same range (confirmed).
const even2014: EvenRule = () => ({ factor: 0.25, note: "even: 25 % of the odd limit of the range (note a)" });
// 2022: even h ≤ 6 → 50 % of the odd limit of the range; h > 6 → 100 % (confirmed).
const even2022: EvenRule = (h) =>
  h <= 6
    ? { factor: 0.5, note: "even h ≤ 6: 50 % of the odd limit of the range" }
    : { factor: 1, note: "even h > 6: 100 % of the odd limit of the range" };

export const ieee5192014Current: LimitSetRevisionContentInput = {
  key: "ieee-519-2014-current",
  standard: "IEEE 519",
  edition: "IEEE Std 519-2014",
  scope: "Current distortion limits at the PCC",
  description:
    "Maximum harmonic current in % of IL by bus voltage (Tables 2, 3, 4) and Isc/IL, orders 2–50; TDD over orders " +
    "2–50 in % of IL. Even orders at 25 % of the odd limit of their range (note a); h = 2 uses the 3 ≤ h < 11 range.",
  quantity: "current",
  appliesTo: CURRENT_APPLIES_TO,
  notes: [ISC_IL_NOTE, `${H2_NOTE} Even orders are limited to 25 % of the odd limit of their range.`, CURRENT_TIME_NOTE],
  bands: currentTables("IEEE Std 519-2014").flatMap((table) =>
    currentBands(table, even2014, `IEEE Std 519-2014 ${table.source.replace(/^IEEE Std 519-2014 /, "")} note (a)`),
  ),
  rules: {
    comparison: {
      passAtLimit: true,
      source: "IEEE Std 519-2014 Tables 2–4 give maximum values: measured ≤ limit passes (Ordwise reading, from memory)",
    },
    timeRules: currentTimeRules("IEEE Std 519-2014", ""),
  },
};

export const ieee5192022Current: LimitSetRevisionContentInput = {
  ...ieee5192014Current,
  key: "ieee-519-2022-current",
  edition: "IEEE Std 519-2022",
  description:
    "Maximum harmonic current in % of IL by bus voltage (Tables 2, 3, 4; values unchanged from 2014) and Isc/IL, " +
    "orders 2–50; TDD over orders 2–50 in % of IL. Even orders: h ≤ 6 at 50 %, h > 6 at 100 % of the odd limit " +
    "of their range; h = 2 uses the 3 ≤ h < 11 range. IBR/DER installations with generation ≥ 10 % of annual " +
    "average demand fall under IEEE 1547 / IEEE 2800 instead.",
  notes: [
    ISC_IL_NOTE,
    `${H2_NOTE} Even orders up to 6 are limited to 50 % and higher even orders to 100 % of the odd limit of their range.`,
    `${CURRENT_TIME_NOTE} The 2022 edition is taken to use the same time rules as the 2014 edition.`,
  ],
  bands: currentTables("IEEE Std 519-2022").flatMap((table) =>
    currentBands(table, even2022, `IEEE Std 519-2022 even-harmonic rule (${table.name})`),
  ),
  rules: {
    comparison: {
      passAtLimit: true,
      source: "IEEE Std 519-2022 Tables 2–4 give maximum values: measured ≤ limit passes (Ordwise reading, from memory)",
    },
    // That IEEE Std 519-2022 keeps the 2014 statistical scheme is from memory.
    timeRules: currentTimeRules("IEEE Std 519-2022", " — same scheme as 2014, from memory"),
  },
};

// IEEE Std 519-2014 Table 1 — voltage distortion limits at the PCC (values confirmed; 1–69 kV and
// 69–161 kV rows also from memory; 2022 identical). Individual orders in % of the rated voltage.
const TABLE_1 = "IEEE Std 519-2014 Table 1";
const voltageRows: Array<{ label: string; busVoltageV: RangeInput; individual: number; thd: number; note?: string }> = [
  { label: "V ≤ 1.0 kV", busVoltageV: { max: 1_000, maxInclusive: true }, individual: 5.0, thd: 8.0 },
  {
    label: "1 kV < V ≤ 69 kV",
    busVoltageV: { min: 1_000, minInclusive: false, max: 69_000, maxInclusive: true },
    individual: 3.0,
    thd: 5.0,
  },
  {
    label: "69 kV < V ≤ 161 kV",
    busVoltageV: { min: 69_000, minInclusive: false, max: 161_000, maxInclusive: true },
    individual: 1.5,
    thd: 2.5,
  },
  {
    label: "V > 161 kV",
    busVoltageV: { min: 161_000, minInclusive: false },
    individual: 1.0,
    thd: 1.5,
    note: "Up to 2.0 % THD where caused by an HVDC terminal whose effects attenuate before future users (from memory; not applied).",
  },
];

export const ieee5192014Voltage: LimitSetRevisionContentInput = {
  key: "ieee-519-2014-voltage",
  standard: "IEEE 519",
  edition: "IEEE Std 519-2014 (Table 1 unchanged in 2022)",
  scope: "Voltage distortion limits at the PCC",
  description:
    "Individual harmonic voltage (orders 2–50) in % of the rated (nominal) voltage of the measured channel and THD " +
    "(orders 2–50) in % of the measured fundamental, by bus voltage. THD uses the fundamental because the standard " +
    "defines THD relative to the fundamental; the difference from % of nominal is small near rated voltage. " +
    "Apply to line-to-neutral voltages.",
  notes: ["Individual voltage harmonics are judged in % of the nominal voltage of the measured channel; voltage THD in % of the measured fundamental."],
  quantity: "voltage",
  appliesTo: "Voltage at the PCC. Context needed: bus (system) voltage and the nominal voltage of the measured channels.",
  bands: voltageRows.map((row) => ({
    label: `Table 1, ${row.label}`,
    description: row.note,
    applicability: { busVoltageV: row.busVoltageV },
    orderRows: [{ from: 2, to: 50, limit: row.individual, basis: "%Vnom", source: TABLE_1 }],
    aggregates: [{ name: "THD", from: 2, to: 50, basis: "%V1", limit: row.thd, note: row.note, source: TABLE_1 }],
    source: TABLE_1,
  })),
  rules: {
    comparison: {
      passAtLimit: true,
      source: "IEEE Std 519-2014 Table 1 gives maximum values: measured ≤ limit passes (Ordwise reading, from memory)",
    },
    timeRules: [
      {
        id: "daily-p99-very-short",
        label: "Daily 99th percentile of 3 s values < 1.5 × limit",
        statistic: "percentile",
        percentile: 99,
        intervalS: 3,
        multiplier: 1.5,
        accumulationS: DAY_S,
        // One complete 3 s value (Ordwise choice).
        minimumDurationS: 3,
        appliesTo: "all",
        passAtLimit: false,
        source: "IEEE Std 519-2014 Table 1 statistics — daily 99th percentile of very short time (3 s) values < 1.5 × Table 1 values (confirmed)",
      },
      {
        id: "weekly-p95-short",
        label: "Weekly 95th percentile of 10 min values < 1.0 × limit",
        statistic: "percentile",
        percentile: 95,
        intervalS: 600,
        multiplier: 1.0,
        accumulationS: WEEK_S,
        // One complete 10-minute interval (Ordwise choice).
        minimumDurationS: 600,
        appliesTo: "all",
        passAtLimit: false,
        source: "IEEE Std 519-2014 Table 1 statistics — weekly 95th percentile of short time (10 min) values < 1.0 × Table 1 values (confirmed; the 99th percentile of short time values is not used for voltage)",
      },
    ],
  },
};

export const ieee519LimitSets = [
  { name: "IEEE 519-2014 current limits", content: ieee5192014Current },
  { name: "IEEE 519-2022 current limits", content: ieee5192022Current },
  { name: "IEEE 519-2014 voltage limits", content: ieee5192014Voltage },
];
