// Turns a detected layout plus the user's overrides into what to read from each column.
import type { CsvLayout } from "./detect-layout";
import { detectChannel } from "./detect-channel";
import { parseHeader } from "./parse-header";
import { parseUnit } from "./parse-unit";
import type { ChannelOverride, PhaseLabel, Quantity } from "./types";

/** How one column will be read. */
export interface ColumnPlan {
  /** 0-based field index. */
  index: number;
  header: string;
  name: string;
  unitText: string | null;
  role: "time" | "channel" | "skipped";
  quantity: Quantity | null;
  phase: PhaseLabel | null;
  /** Factor from the written unit to the base unit (ms → 0.001, mA → 0.001). */
  toBase: number;
  /** User scale factor (CT ratio, probe factor), 1 when none. */
  scale: number;
  /** Why the column is skipped, or a name/unit conflict worth a warning. */
  note: string | null;
}

/**
 * Finds the override for a column: keys match the header text or the name without its unit,
 * case-insensitively ("Ia (A)" or "ia").
 *
 * @example
 * findOverride({ ia: { scale: 100 } }, "Ia (A)", "Ia") // { scale: 100 }
 */
export function findOverride(
  overrides: Record<string, ChannelOverride> | undefined,
  header: string,
  name: string,
): ChannelOverride | undefined {
  if (!overrides) return undefined;
  const h = header.toLowerCase();
  const n = name.toLowerCase();
  for (const [key, value] of Object.entries(overrides)) {
    const k = key.trim().toLowerCase();
    if (k === h || k === n) return value;
  }
  return undefined;
}

/**
 * Plans every column of a layout: the column the user chose as time, else the first time-like
 * column, is the time axis; the others are
 * channels whose quantity comes from the override, the name or the unit (in that order); a column
 * whose quantity stays unknown is skipped with a note.
 *
 * Complexity O(columns).
 *
 * @example
 * planColumns(detectLayout("t (s),Ia (A)\n0,1\n1e-4,2\n", true), {})[1] // { role: "channel", quantity: "current", … }
 */
export function planColumns(layout: CsvLayout, overrides: Record<string, ChannelOverride> | undefined): ColumnPlan[] {
  let timeSeen = false;
  const timeChosen = layout.headers.some((cell) => {
    const parsed = parseHeader(cell);
    return findOverride(overrides, parsed.header, parsed.name)?.time === true;
  });
  return layout.headers.map((cell, index) => {
    const parsed = parseHeader(cell);
    const unitCell = layout.units?.[index];
    if (unitCell) {
      parsed.unit = parseUnit(unitCell);
      parsed.unitText = unitCell.replace(/^[([]\s*|\s*[)\]]$/g, "");
      parsed.unitPosition = "units-row";
    }
    const detected = detectChannel(parsed);
    const override = findOverride(overrides, parsed.header, parsed.name);
    const base = {
      index,
      header: parsed.header,
      name: parsed.name,
      unitText: detected.unitText,
      toBase: detected.unit?.toBase ?? 1,
      scale: override?.scale ?? 1,
    };
    // Columns the user chose to ignore are read past silently (no warning: it was their choice).
    if (override?.ignore) return { ...base, role: "skipped", quantity: null, phase: null, note: null };
    const asTime = timeChosen ? override?.time === true : detected.role === "time" && override?.quantity === undefined;
    if (asTime && !timeSeen) {
      timeSeen = true;
      const unitNote = detected.unit?.baseUnit === "s" ? null : `time column "${parsed.header}" has no time unit; seconds assumed`;
      return { ...base, toBase: detected.unit?.baseUnit === "s" ? detected.unit.toBase : 1, role: "time", quantity: null, phase: null, note: unitNote };
    }
    if (override?.time || (detected.role === "time" && override?.quantity === undefined)) {
      return { ...base, role: "skipped", quantity: null, phase: null, note: `column "${parsed.header}" skipped: another column is the time axis` };
    }
    const quantity = override?.quantity ?? (detected.role === "time" ? null : detected.quantity);
    const phase = override && "phase" in override ? override.phase ?? null : detected.phase;
    if (quantity === null) {
      return {
        ...base,
        role: "skipped",
        quantity: null,
        phase,
        note: `column "${parsed.header}" skipped: neither its name nor its unit says current or voltage (map it as current or voltage to analyse it)`,
      };
    }
    // A unit of the other quantity (a clamp in mV) is a raw probe output: keep its prefix, the scale makes it A or V.
    return { ...base, role: "channel", quantity, phase, note: override?.quantity || override?.scale ? null : detected.conflict };
  });
}
