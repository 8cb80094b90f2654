// The spectrum's bars and limit marks in the channel's own unit (A or V), shared by the sheet's
// spectrum chart and its "show as table" view, so the bar is the value the verdict compared.
import { CAPTURE_MEAN_RULE, type ComplianceRow } from "../compliance/result";

/** What converts a row's unit (%IL, %Iref, %Vnom, %I1, %V1) to the channel's unit. */
export interface SpectrumScale {
  /** Measured fundamental of the channel, A or V (for %I1 / %V1). */
  fundamentalRms: number;
  /** Maximum demand load current IL from the evaluation context, A (for %IL, IEEE 519). */
  ilA?: number;
  /** Reference current used for the channel (given or derived), A (for %Iref, IEC 61000-3-12). */
  irefA?: number;
  /** Nominal voltage from the evaluation context, V (for %Vnom). */
  nominalVoltageV?: number;
}

/** One order's bar: the value shown, its limit mark (both in the channel's unit), and whether it failed. */
export interface SpectrumBar {
  order: number;
  /** The value the verdict compared — a time rule's statistic where one decided, else the capture r.m.s. mean. */
  value: number | null;
  /** The limit the verdict compared against (table limit × the rule's multiplier where a rule decided). */
  limit: number | null;
  failing: boolean;
  /** True where the bar is a time rule's statistic rather than the capture mean. */
  byTimeRule: boolean;
}

/**
 * Channel-unit amount (A or V) per one of a row's unit (%IL, %Iref, %Vnom, %I1, %V1, A, V), or null
 * when the base is not known — e.g. 2.6 A per %IL with IL = 260 A. Also used where a table shows a
 * limit in amperes beside the row's own unit (the "try a fix" table).
 */
export function unitScale(unit: string, scale: SpectrumScale): number | null {
  const percentOf = (base: number | undefined) => (base !== undefined && Number.isFinite(base) && base > 0 ? base / 100 : null);
  switch (unit) {
    case "A":
    case "V":
      return 1;
    case "%I1":
    case "%V1":
      return percentOf(scale.fundamentalRms);
    case "%IL":
      return percentOf(scale.ilA);
    case "%Iref":
      return percentOf(scale.irefA);
    case "%Vnom":
      return percentOf(scale.nominalVoltageV);
    default:
      return null;
  }
}

function decidedByTimeRule(row: ComplianceRow): boolean {
  return row.decidedBy !== undefined && row.decidedBy !== CAPTURE_MEAN_RULE && row.decidedBy !== "threshold" && row.measured !== null;
}

/**
 * The bars of a spectrum from the analysed harmonics and the evaluation's rows: where a time rule
 * decided an order the bar is that rule's statistic and the mark its limit (table × multiplier),
 * converted from the row's unit (e.g. %IL of IEEE 519) to the channel's unit with the same base
 * the evaluator divided by; elsewhere the bar is the capture r.m.s. mean. A row whose unit cannot
 * be converted keeps the capture mean and, for its limit, the ratio limit / measured of that mean.
 * O(orders).
 *
 * @example
 * // IEEE 519 %IL, IL = 100 A: a 3 s p99 of 4.2 %IL against 2 × 4.0 %IL → bar 4.2 A, mark 8.0 A
 * spectrumBars([{ order: 5, rms: 3.1 }], [h5Row], { fundamentalRms: 90, ilA: 100 })[0] // { value: 4.2, limit: 8, … }
 */
export function spectrumBars(harmonics: Array<{ order: number; rms: number | null }>, rows: ComplianceRow[], scale: SpectrumScale): SpectrumBar[] {
  const byOrder = new Map(rows.map((r) => [r.order, r]));
  return harmonics.map((h) => {
    const row = byOrder.get(h.order);
    if (!row) return { order: h.order, value: h.rms, limit: null, failing: false, byTimeRule: false };
    const k = unitScale(row.unit, scale);
    const failing = row.verdict === "fail";
    const ruled = decidedByTimeRule(row);
    if (k !== null) {
      return {
        order: h.order,
        value: ruled ? (row.measured as number) * k : h.rms,
        limit: row.limit === null ? null : row.limit * k,
        failing,
        byTimeRule: ruled,
      };
    }
    // Unknown scale: the ratio limit / measured holds only while the row's measured value is the capture mean.
    const ratioLimit = !ruled && row.limit !== null && row.measured !== null && row.measured > 0 && h.rms !== null && h.rms > 0 ? row.limit * (h.rms / row.measured) : null;
    return { order: h.order, value: h.rms, limit: ratioLimit, failing, byTimeRule: false };
  });
}
