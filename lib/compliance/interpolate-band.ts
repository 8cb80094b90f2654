// Linear interpolation between successive minimum-Rsce rows (IEC 61000-3-12 permits it).
import type { AggregateRow, Band, EvaluationContext, LimitSetRevisionContent, OrderRow } from "./model";

export interface InterpolatedBand {
  band: Band;
  description: string;
}

const round = (x: number): number => Math.round(x * 1e6) / 1e6;

function sameOrders(a: OrderRow, b: OrderRow): boolean {
  return a.from === b.from && a.to === b.to && a.parity === b.parity && a.basis === b.basis;
}

function sameKey(a: Band, b: Band): boolean {
  return (
    (a.option?.group ?? "") === (b.option?.group ?? "") &&
    (a.option?.label ?? "") === (b.option?.label ?? "") &&
    JSON.stringify(a.applicability.phaseConfig ?? []) === JSON.stringify(b.applicability.phaseConfig ?? [])
  );
}

/**
 * Replace a band's numeric limits by linear interpolation towards the next Rsce row, when the
 * limit set permits interpolation and the context's Rsce lies strictly between two rows.
 *
 * Rows match by orders and basis, aggregates by name; formula rows and rows without a partner
 * are kept as they are. Returns null when no interpolation applies (Rsce exactly on a row, the
 * last row, interpolation off). O(rows).
 *
 * @example
 * interpolateBand(iec61000312, table3Rsce33, { rsce: 49.5, phaseConfig: "balanced-three-phase" })
 * // I5 limit 10.7 + (49.5−33)/(66−33)·(14−10.7) = 12.35 % of Iref
 */
export function interpolateBand(
  content: LimitSetRevisionContent,
  band: Band,
  context: EvaluationContext,
): InterpolatedBand | null {
  const rule = content.rules.interpolation;
  const rsce = context.rsce;
  const range = band.applicability.rsce;
  if (!rule || rsce === undefined || !range || range.min === undefined || range.max === undefined) return null;
  if (!(context.interpolate ?? rule.defaultOn)) return null;
  if (rsce <= range.min) return null;
  const next = content.bands.find(
    (candidate) => candidate !== band && candidate.applicability.rsce?.min === range.max && sameKey(candidate, band),
  );
  if (!next) return null;
  const low = range.min;
  const high = range.max;
  const t = (rsce - low) / (high - low);
  const lerp = (a: number, b: number): number => round(a + t * (b - a));

  const orderRows: OrderRow[] = band.orderRows.map((row) => {
    const partner = next.orderRows.find((candidate) => sameOrders(candidate, row));
    if (row.limit === undefined || partner?.limit === undefined || partner.limit === row.limit) return row;
    return {
      ...row,
      limit: lerp(row.limit, partner.limit),
      note: `interpolated: ${row.limit} at Rsce ${low} → ${partner.limit} at Rsce ${high}`,
    };
  });
  const aggregates: AggregateRow[] = band.aggregates.map((aggregate) => {
    const partner = next.aggregates.find((candidate) => candidate.name === aggregate.name);
    if (aggregate.limit === undefined || partner?.limit === undefined || partner.limit === aggregate.limit) return aggregate;
    return {
      ...aggregate,
      limit: lerp(aggregate.limit, partner.limit),
      note: `interpolated: ${aggregate.limit} at Rsce ${low} → ${partner.limit} at Rsce ${high}`,
    };
  });
  return {
    band: { ...band, label: `${band.label} interpolated at Rsce ${rsce}`, orderRows, aggregates },
    description: `Rsce ${rsce} lies between the rows ${low} and ${high}: limits interpolated linearly (t = ${round(t)})`,
  };
}
