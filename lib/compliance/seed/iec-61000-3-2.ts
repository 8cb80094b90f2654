// IEC 61000-3-2 (equipment ≤ 16 A per phase) — Classes A, B, C, D as limit-set revisions, from
// IEC 61000-3-2:2018+A1:2020 (Ed 5.1): Table 1 (Class A; Class B = 1.5 × Table 1), Table 2 (Class C),
// Table 3 (Class D), clause 6.2 (time aspects, threshold) and clause 7 (limits, exemptions, POHC).
// How far each value was checked, on its row's source in plain words: "confirmed" — against a
// published reproduction of the standard's text; "secondary source" — only against an engineering
// note quoting it; "from memory" — recalled, not checked; "computed from formula" — arithmetic on the
// printed formula; "Ordwise choice" / "Ordwise reading" — where the text leaves a choice, the one made here.
import type { AggregateRowInput, LimitSetRevisionContentInput, OrderRowInput, RulesInput, TimeRuleInput } from "../model";

const STANDARD = "IEC 61000-3-2";
const EDITION = "Ed 5.1 (2018+A1:2020)";
const ED = "IEC 61000-3-2:2018+A1:2020";

// Shared measurement rules (clauses 6.2 and 7).
const rules: RulesInput = {
  comparison: {
    passAtLimit: true,
    // Average of the 1.5 s smoothed values shall be ≤ 100 % of the limit: averaging confirmed, "≤" wording from memory.
    source: `${ED} clause 6.2 — average value ≤ 100 % of the applicable limit (averaging: confirmed; "≤" wording from memory)`,
  },
  threshold: {
    // Disregard currents < 0.6 % of the input current or < 5 mA, whichever is greater — from memory.
    percentOfInputCurrent: 0.6,
    minimumA: 0.005,
    source: `${ED} clause 6.2 — harmonic currents below 0.6 % of the input current or below 5 mA, whichever is greater, are disregarded (from memory)`,
  },
  pohcAllowance: {
    // Odd orders 21–39 may exceed the individual limit by 50 % if measured POHC ≤ POHC of the limits — from memory.
    from: 21,
    to: 39,
    parity: "odd",
    factor: 1.5,
    aggregate: "POHC",
    source: `${ED} clause 7 — for odd orders 21–39 the average may exceed the individual limit by 50 % provided the measured POHC does not exceed the POHC computed from the limits and every 1.5 s smoothed value stays ≤ 150 % of its limit (from memory); without per-window series only the POHC condition is checked`,
  },
  timeRules: iec6100032TimeRules({ pohcAllowance: true, relaxation: false }),
};

/**
 * The time aspects of IEC 61000-3-2 (clause 6.2): per order, the arithmetic average of the
 * 1.5 s smoothed values over the observation period ≤ the limit, and every 1.5 s smoothed value
 * ≤ 150 % of the limit; Class A may use the 200 % relaxation (data, off by default).
 */
export function iec6100032TimeRules(options: { pohcAllowance: boolean; relaxation: boolean; edition?: string }): TimeRuleInput[] {
  const ed = options.edition ?? ED;
  // One time constant of record as the shortest evaluable observation (Ordwise choice; the
  // standard sets the observation period by the equipment's cycle and repeatability — from memory).
  const minimumDurationS = 1.5;
  return [
    {
      id: "smoothed-average",
      label: "Average of 1.5 s smoothed values ≤ 100 % of the limit",
      statistic: "mean",
      intervalS: 1.5,
      multiplier: 1,
      minimumDurationS,
      // Aggregates too: the POHC allowance condition is judged on the averaged values (Ordwise reading).
      appliesTo: "all",
      ...(options.pohcAllowance ? { pohcAllowance: true } : {}),
      note: "Observation period = the whole record; 1.5 s smoothing per IEC 61000-4-7 (τ = 1.5 s).",
      source: `${ed} clause 6.2 — arithmetic average of the 1.5 s smoothed r.m.s. values over the observation period (confirmed) ≤ 100 % of the limit ("≤" wording from memory)`,
    },
    {
      id: "smoothed-max",
      label: "Every 1.5 s smoothed value ≤ 150 % of the limit",
      statistic: "max",
      intervalS: 1.5,
      multiplier: 1.5,
      minimumDurationS,
      appliesTo: "orders",
      ...(options.relaxation
        ? {
            relaxation: {
              enabled: false,
              multiplier: 2,
              maxExcursionFraction: 0.1,
              maxExcursionS: 600,
              averageBelowFraction: 0.9,
              source: `${ed} clause 6.2 — Class A only: ≤ 200 % if excursions above 150 % last < 10 % of the observation period or 10 min in aggregate, whichever is smaller, and the average is < 90 % of the limit (from memory); off unless a revision enables it`,
            },
          }
        : {}),
      source: `${ed} clause 6.2 — each 1.5 s smoothed r.m.s. value ≤ 150 % of the applicable limit (from memory)`,
    },
  ];
}

// No POHC allowance for Class C (none recalled for lighting equipment — from memory).
const { pohcAllowance: _unusedForClassC, ...classCShared } = rules;
const classCRules: RulesInput = { ...classCShared, timeRules: iec6100032TimeRules({ pohcAllowance: false, relaxation: false }) };
// Only Class A may use the 200 % relaxation (from memory) — present as data, disabled.
const classARules: RulesInput = { ...rules, timeRules: iec6100032TimeRules({ pohcAllowance: true, relaxation: true }) };

// IEC 61000-3-2:2018+A1:2020 Table 1 — Class A maximum permissible harmonic current, amperes.
// Fixed rows n = 2…13 and the formula rows 0.15·15/n (odd 15–39) and 0.23·8/n (even 8–40): confirmed.
const TABLE_1 = `${ED} Table 1 (Class A)`;
const classARows: OrderRowInput[] = [
  { from: 3, to: 3, limit: 2.3, basis: "A", source: TABLE_1 },
  { from: 5, to: 5, limit: 1.14, basis: "A", source: TABLE_1 },
  { from: 7, to: 7, limit: 0.77, basis: "A", source: TABLE_1 },
  { from: 9, to: 9, limit: 0.4, basis: "A", source: TABLE_1 },
  { from: 11, to: 11, limit: 0.33, basis: "A", source: TABLE_1 },
  { from: 13, to: 13, limit: 0.21, basis: "A", source: TABLE_1 },
  { from: 15, to: 39, parity: "odd", formula: "0.15*15/h", basis: "A", source: TABLE_1 },
  { from: 2, to: 2, limit: 1.08, basis: "A", source: TABLE_1 },
  { from: 4, to: 4, limit: 0.43, basis: "A", source: TABLE_1 },
  { from: 6, to: 6, limit: 0.3, basis: "A", source: TABLE_1 },
  { from: 8, to: 40, parity: "even", formula: "0.23*8/h", basis: "A", source: TABLE_1 },
];

// POHC = sqrt(Σ_{n=21,23,…,39} I_n²) (definition from memory); its limit is the same sum over
// the limit values (from memory) → Class A 0.2514 A, Class B 0.3771 A (computed from formula).
const pohcAggregate: AggregateRowInput = {
  name: "POHC",
  from: 21,
  to: 39,
  parity: "odd",
  basis: "A",
  fromOrderLimits: true,
  role: "allowance-condition",
  note: "Decides only whether the 21–39 POHC allowance may be used.",
  source: `${ED} clause 3 (POHC definition) — from memory; limit computed from formula over the order limits`,
};

// Class B = 1.5 × Class A (confirmed) — stored explicitly so each row is readable on its own.
const CLASS_B_FACTOR = 1.5;
const classBRows: OrderRowInput[] = classARows.map((row) => ({
  ...row,
  ...(row.limit !== undefined
    ? { limit: Math.round(row.limit * CLASS_B_FACTOR * 10000) / 10000 }
    : { formula: `${CLASS_B_FACTOR}*(${row.formula as string})` }),
  source: `${ED} Table 1 × 1.5 (Class B = 1.5 × Class A, confirmed)`,
}));

// Interpretation choices in plain words, listed once on the sheet's notes (per-row sources stay on the rows).
const TIME_NOTE =
  "Time rules: the average of the 1.5 s smoothed values is compared with the limit and each smoothed value with 150 % of it; " +
  "a record shorter than one 1.5 s time constant is not judged by them (the standard sets the observation period by the equipment's cycle).";
const POWER_NOTE = "Rated power P: the declared value when it is within ±10 % of the measured active power, else the measured active power.";

export const iec6100032ClassA: LimitSetRevisionContentInput = {
  key: "iec-61000-3-2-class-a",
  standard: STANDARD,
  edition: EDITION,
  scope: "Class A",
  description:
    "Maximum permissible harmonic currents for Class A equipment, amperes, orders 2–40 (Table 1). " +
    "Equipment with rated power ≤ 75 W other than lighting, professional equipment > 1 kW, symmetrically " +
    "controlled heating elements ≤ 200 W and independent dimmers for incandescent lamps ≤ 1 kW have no limits; " +
    "the evaluator does not apply these exemptions for Class A.",
  quantity: "current",
  notes: [TIME_NOTE],
  appliesTo:
    "Equipment ≤ 16 A per phase on public LV systems (≥ 220 V line-to-neutral) not in Class B, C or D: balanced " +
    "three-phase equipment, household appliances, vacuum cleaners, high-pressure cleaners, non-portable tools, " +
    "independent phase-control dimmers, audio equipment, professional stage/studio luminaires.",
  bands: [
    {
      label: "Class A",
      description: "One table for all Class A equipment.",
      orderRows: classARows,
      aggregates: [pohcAggregate],
      source: TABLE_1,
    },
  ],
  rules: classARules,
};

export const iec6100032ClassB: LimitSetRevisionContentInput = {
  key: "iec-61000-3-2-class-b",
  standard: STANDARD,
  edition: EDITION,
  scope: "Class B",
  description: "Class B limits = 1.5 × the Class A values of Table 1, amperes, orders 2–40.",
  quantity: "current",
  notes: [TIME_NOTE],
  appliesTo: "Portable tools; arc-welding equipment that is not professional equipment (≤ 16 A per phase).",
  bands: [
    {
      label: "Class B",
      orderRows: classBRows,
      aggregates: [pohcAggregate],
      source: `${ED} Table 1 × 1.5`,
    },
  ],
  rules,
};

// IEC 61000-3-2:2018+A1:2020 Table 2 — Class C, active input power > 25 W, % of fundamental
// input current (all values confirmed; "no limit for even n > 2" from memory).
const TABLE_2 = `${ED} Table 2 (Class C, > 25 W)`;
// Class D Table 3 column 2 (mA/W) reused by Class C ≤ 25 W option a (structure from memory).
const TABLE_3 = `${ED} Table 3 (Class D)`;

export const iec6100032ClassC: LimitSetRevisionContentInput = {
  key: "iec-61000-3-2-class-c",
  standard: STANDARD,
  edition: EDITION,
  scope: "Class C",
  description:
    "Lighting equipment. > 25 W: % of fundamental current (Table 2), third harmonic 30·λ %. 5 W < P ≤ 25 W: " +
    "comply with one option — (a) Class D mA/W limits, (b) I3 ≤ 86 %, I5 ≤ 61 % of I1 plus waveform angle " +
    "conditions (not checkable from harmonic magnitudes; assert them by id). Option (c) of Ed 5 (THC ≤ 70 %) is " +
    "NOT included: its values could not be checked against the standard's text. ≤ 5 W: no limits. Luminaires with incandescent " +
    "lamps and built-in phase-control dimming > 25 W use Class A instead. Dimmable/colour-controlled lighting: " +
    "derive the limits at the Pmax condition and apply them in all control conditions.",
  quantity: "current",
  notes: [TIME_NOTE, POWER_NOTE, "λ (circuit power factor) for the third-harmonic limit: the measured true power factor when none is given."],
  appliesTo:
    "Lighting equipment: lamps, luminaires, independent control gear, UV/IR radiation equipment, illuminated " +
    "signs, non-phase-control dimmers, DLT control devices (AMD1 2020 list).",
  bands: [
    {
      label: "Class C, P ≤ 5 W (no limits)",
      applicability: { ratedPowerW: { max: 5, maxInclusive: true } },
      exempt: true,
      source: `${ED} clause 7 — lighting equipment ≤ 5 W: no limits (confirmed)`,
    },
    {
      label: "Class C, 5 W < P ≤ 25 W, option a",
      applicability: { ratedPowerW: { min: 5, minInclusive: false, max: 25, maxInclusive: true } },
      option: { group: "class-c-5-to-25-w", label: "a — Class D power-related limits (mA/W)" },
      orderRows: [
        { from: 3, to: 3, limit: 3.4, basis: "mA/W", source: `${TABLE_3} column 2 (structure from memory)` },
        { from: 5, to: 5, limit: 1.9, basis: "mA/W", source: `${TABLE_3} column 2 (structure from memory)` },
        { from: 7, to: 7, limit: 1.0, basis: "mA/W", source: `${TABLE_3} column 2 (structure from memory)` },
        { from: 9, to: 9, limit: 0.5, basis: "mA/W", source: `${TABLE_3} column 2 (structure from memory)` },
        { from: 11, to: 11, limit: 0.35, basis: "mA/W", source: `${TABLE_3} column 2 (structure from memory)` },
        {
          from: 13,
          to: 39,
          parity: "odd",
          formula: "3.85/h",
          basis: "mA/W",
          source: `${TABLE_3} column 2 (structure from memory)`,
        },
      ],
      source: `${ED} clause 7.4 option a — from memory (structure)`,
    },
    {
      label: "Class C, 5 W < P ≤ 25 W, option b",
      applicability: { ratedPowerW: { min: 5, minInclusive: false, max: 25, maxInclusive: true } },
      option: { group: "class-c-5-to-25-w", label: "b — I3 ≤ 86 %, I5 ≤ 61 % of I1 and waveform conditions" },
      conditions: [
        {
          id: "iec-61000-3-2-class-c-option-b-waveform",
          text:
            "Current reaches the 5 % threshold at or before 60°, has its (last) peak at or before 65°, and does not " +
            "fall below the threshold before 90° (0° = zero crossing of the fundamental supply voltage)",
          source: `${ED} clause 7.4 option b — angles confirmed`,
        },
      ],
      orderRows: [
        { from: 3, to: 3, limit: 86, basis: "%I1", source: `${ED} clause 7.4 option b — 86 % from memory` },
        { from: 5, to: 5, limit: 61, basis: "%I1", source: `${ED} clause 7.4 option b — 61 % from memory` },
      ],
      source: `${ED} clause 7.4 option b`,
    },
    {
      label: "Class C, P > 25 W",
      applicability: { ratedPowerW: { min: 25, minInclusive: false } },
      orderRows: [
        { from: 2, to: 2, limit: 2, basis: "%I1", source: TABLE_2 },
        {
          from: 3,
          to: 3,
          formula: "30*lambda",
          basis: "%I1",
          note: "λ = circuit power factor",
          source: TABLE_2,
        },
        { from: 5, to: 5, limit: 10, basis: "%I1", source: TABLE_2 },
        { from: 7, to: 7, limit: 7, basis: "%I1", source: TABLE_2 },
        { from: 9, to: 9, limit: 5, basis: "%I1", source: TABLE_2 },
        { from: 11, to: 39, parity: "odd", limit: 3, basis: "%I1", source: TABLE_2 },
      ],
      source: TABLE_2,
    },
  ],
  rules: classCRules,
};

// IEC 61000-3-2:2018+A1:2020 Table 3 — Class D, power-related limit (mA/W) and absolute
// maximum (A) = Class A values; limit = min(mA/W × P, max) — all confirmed.
export const iec6100032ClassD: LimitSetRevisionContentInput = {
  key: "iec-61000-3-2-class-d",
  standard: STANDARD,
  edition: EDITION,
  scope: "Class D",
  description:
    "Power-related limits (mA/W × rated power) capped by the absolute maximum (= Class A values); " +
    "\"always use the lower figure\". Even orders have no Class D limit (from memory). P is the specified " +
    "power (the maximum of the 1.5 s smoothed active power during the test, or a declared value within ±10 %).",
  quantity: "current",
  notes: [TIME_NOTE, POWER_NOTE, "Class D limits apply for 75 W < P ≤ 600 W; at or below 75 W there are no limits. Even orders have no Class D limit."],
  appliesTo:
    "Specified power ≤ 600 W: personal computers and PC monitors, television receivers, and (Ed 5) refrigerators " +
    "and freezers with variable-speed compressor drives. Above 600 W such equipment is Class A.",
  bands: [
    {
      label: "Class D, P ≤ 75 W (no limits)",
      applicability: { ratedPowerW: { max: 75, maxInclusive: true } },
      exempt: true,
      source: `${ED} clause 7 — equipment with rated power ≤ 75 W other than lighting: no limits (confirmed)`,
    },
    {
      label: "Class D, 75 W < P ≤ 600 W",
      applicability: { ratedPowerW: { min: 75, minInclusive: false, max: 600, maxInclusive: true } },
      orderRows: [
        { from: 3, to: 3, limit: 3.4, capA: 2.3, basis: "mA/W", source: TABLE_3 },
        { from: 5, to: 5, limit: 1.9, capA: 1.14, basis: "mA/W", source: TABLE_3 },
        { from: 7, to: 7, limit: 1.0, capA: 0.77, basis: "mA/W", source: TABLE_3 },
        { from: 9, to: 9, limit: 0.5, capA: 0.4, basis: "mA/W", source: TABLE_3 },
        { from: 11, to: 11, limit: 0.35, capA: 0.33, basis: "mA/W", source: TABLE_3 },
        { from: 13, to: 13, formula: "3.85/h", capA: 0.21, basis: "mA/W", source: TABLE_3 },
        {
          from: 15,
          to: 39,
          parity: "odd",
          formula: "3.85/h",
          capFormulaA: "0.15*15/h",
          basis: "mA/W",
          source: `${TABLE_3}; cap = Class A Table 1 formula`,
        },
      ],
      aggregates: [{ ...pohcAggregate, note: "POHC of the capped limits; 0.4301 mA/W × P below the caps (computed from formula)." }],
      source: TABLE_3,
    },
  ],
  rules,
};

export const iec6100032LimitSets = [
  { name: "IEC 61000-3-2 Class A", content: iec6100032ClassA },
  { name: "IEC 61000-3-2 Class B", content: iec6100032ClassB },
  { name: "IEC 61000-3-2 Class C (lighting)", content: iec6100032ClassC },
  { name: "IEC 61000-3-2 Class D", content: iec6100032ClassD },
];
