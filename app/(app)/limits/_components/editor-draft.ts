// The structured editor's working copy of a revision: numbers kept as the typed text so a
// half-typed "0." survives, converted back to revision content for validation and saving.
import type {
  AggregateName,
  AggregateRow,
  Basis,
  Band,
  LimitSetRevisionContent,
  OrderRow,
  Parity,
  PhaseConfig,
  Range,
} from "@/lib/compliance/model";

export const rangeKeys = ["iscOverIl", "busVoltageV", "rsce", "ratedPowerW"] as const;
export type RangeKey = (typeof rangeKeys)[number];
export const rangeLabels: Record<RangeKey, string> = {
  iscOverIl: "Isc/IL",
  busVoltageV: "Bus voltage (V)",
  rsce: "Rsce",
  ratedPowerW: "Rated power (W)",
};

export interface RangeDraft {
  min: string;
  max: string;
  minInclusive: boolean;
  maxInclusive: boolean;
  boundaryRule?: string;
}

export interface RowDraft {
  id: string;
  from: string;
  to: string;
  parity: Parity;
  mode: "limit" | "formula";
  value: string;
  basis: Basis;
  capMode: "none" | "capA" | "capFormulaA";
  cap: string;
  /** Fields the form does not edit (note, source), carried through unchanged. */
  extra: Pick<OrderRow, "note" | "source">;
}

export interface AggregateDraft {
  id: string;
  name: AggregateName;
  from: string;
  to: string;
  parity: Parity;
  weighting: "none" | "order";
  basis: Basis;
  mode: "limit" | "formula" | "fromOrderLimits";
  value: string;
  role: "requirement" | "allowance-condition";
  extra: Pick<AggregateRow, "note" | "source">;
}

export interface BandDraft {
  id: string;
  label: string;
  ranges: Record<RangeKey, RangeDraft>;
  phaseConfig: PhaseConfig[];
  rows: RowDraft[];
  aggregates: AggregateDraft[];
  /** Everything else of the band (description, option, conditions, …), carried through. */
  extra: Omit<Band, "label" | "applicability" | "orderRows" | "aggregates">;
}

export interface ContentDraft {
  extra: Omit<LimitSetRevisionContent, "bands" | "notes">;
  /** The set's interpretation notes as typed, one per line (blank lines dropped on saving). */
  notesText: string;
  bands: BandDraft[];
}

let counter = 0;
export const newId = () => `d${(counter += 1)}`;

const text = (n: number | undefined) => (n === undefined ? "" : String(n));

/** Empty text is "not given"; anything else goes to zod as a number (NaN is reported as "must be a number"). */
const num = (s: string): number | undefined => (s.trim() === "" ? undefined : Number(s.trim()));
const required = (s: string): number => (s.trim() === "" ? Number.NaN : Number(s.trim()));

function rangeDraft(range: Range | undefined): RangeDraft {
  return {
    min: text(range?.min),
    max: text(range?.max),
    minInclusive: range?.minInclusive ?? true,
    maxInclusive: range?.maxInclusive ?? false,
    ...(range?.boundaryRule !== undefined ? { boundaryRule: range.boundaryRule } : {}),
  };
}

export function emptyRow(basis: Basis = "A"): RowDraft {
  return { id: newId(), from: "", to: "", parity: "all", mode: "limit", value: "", basis, capMode: "none", cap: "", extra: {} };
}

export function emptyAggregate(basis: Basis = "%I1"): AggregateDraft {
  return { id: newId(), name: "THD", from: "2", to: "40", parity: "all", weighting: "none", basis, mode: "limit", value: "", role: "requirement", extra: {} };
}

/** Content → working copy. */
export function toDraft(content: LimitSetRevisionContent): ContentDraft {
  const { bands, notes, ...extra } = content;
  return {
    extra,
    notesText: (notes ?? []).join("\n"),
    bands: bands.map(({ label, applicability, orderRows, aggregates, ...bandExtra }) => ({
      id: newId(),
      label,
      ranges: Object.fromEntries(rangeKeys.map((k) => [k, rangeDraft(applicability[k])])) as Record<RangeKey, RangeDraft>,
      phaseConfig: applicability.phaseConfig ?? [],
      extra: bandExtra,
      rows: orderRows.map((row) => ({
        id: newId(),
        from: String(row.from),
        to: String(row.to),
        parity: row.parity,
        mode: row.formula !== undefined ? "formula" : "limit",
        value: row.formula ?? text(row.limit),
        basis: row.basis,
        capMode: row.capFormulaA !== undefined ? "capFormulaA" : row.capA !== undefined ? "capA" : "none",
        cap: row.capFormulaA ?? text(row.capA),
        extra: { ...(row.note !== undefined ? { note: row.note } : {}), ...(row.source !== undefined ? { source: row.source } : {}) },
      })),
      aggregates: aggregates.map((a) => ({
        id: newId(),
        name: a.name,
        from: String(a.from),
        to: String(a.to),
        parity: a.parity,
        weighting: a.weighting,
        basis: a.basis,
        mode: a.fromOrderLimits ? "fromOrderLimits" : a.formula !== undefined ? "formula" : "limit",
        value: a.formula ?? text(a.limit),
        role: a.role,
        extra: { ...(a.note !== undefined ? { note: a.note } : {}), ...(a.source !== undefined ? { source: a.source } : {}) },
      })),
    })),
  };
}

function rangeOf(d: RangeDraft): Record<string, unknown> | undefined {
  if (d.min.trim() === "" && d.max.trim() === "") return undefined;
  return {
    ...(num(d.min) !== undefined ? { min: num(d.min) } : {}),
    ...(num(d.max) !== undefined ? { max: num(d.max) } : {}),
    minInclusive: d.minInclusive,
    maxInclusive: d.maxInclusive,
    ...(d.boundaryRule !== undefined ? { boundaryRule: d.boundaryRule } : {}),
  };
}

/** Working copy → revision content as plain JSON, still to be validated by the schema. */
export function fromDraft(draft: ContentDraft): unknown {
  // Meta, then bands, then rules: the order a person reads the JSON in.
  const { rules, ...meta } = draft.extra;
  const notes = draft.notesText.split("\n").map((line) => line.trim()).filter((line) => line !== "");
  return {
    ...meta,
    ...(notes.length > 0 ? { notes } : {}),
    bands: draft.bands.map((band) => {
      const applicability: Record<string, unknown> = {};
      for (const k of rangeKeys) {
        const r = rangeOf(band.ranges[k]);
        if (r) applicability[k] = r;
      }
      if (band.phaseConfig.length > 0) applicability.phaseConfig = band.phaseConfig;
      return {
        label: band.label,
        ...band.extra,
        applicability,
        orderRows: band.rows.map((row) => ({
          from: required(row.from),
          to: required(row.to),
          parity: row.parity,
          ...(row.mode === "formula" ? { formula: row.value.trim() } : { limit: required(row.value) }),
          basis: row.basis,
          ...(row.capMode === "capA" ? { capA: required(row.cap) } : row.capMode === "capFormulaA" ? { capFormulaA: row.cap.trim() } : {}),
          ...row.extra,
        })),
        aggregates: band.aggregates.map((a) => ({
          name: a.name,
          from: required(a.from),
          to: required(a.to),
          parity: a.parity,
          weighting: a.weighting,
          basis: a.basis,
          ...(a.mode === "formula" ? { formula: a.value.trim() } : a.mode === "fromOrderLimits" ? { fromOrderLimits: true } : { limit: required(a.value) }),
          role: a.role,
          ...a.extra,
        })),
      };
    }),
    rules,
  };
}
