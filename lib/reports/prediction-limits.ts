import type { EvaluationContext } from "@/lib/compliance/model";
import type { ComplianceRow } from "@/lib/compliance/result";
import { unitScale } from "./spectrum-bars";
import { tableLimitOf } from "./time-rules";

/** What a what-if table prints of a row's table limit: in its own unit, and in amperes. */
export interface PredictionLimits {
  /** The unit the limit table states (%IL, %Iref, %I1, … or A). */
  unit: string;
  /** A row's table limit in that unit; null without a row or a limit. */
  tableLimit: (row: ComplianceRow | undefined) => number | null;
  /** The same in amperes, with the base the evaluator used; null where the base is not known. */
  tableLimitA: (row: ComplianceRow | undefined) => number | null;
}

/**
 * One unit per column for the tables of a what-if (the "try a fix" panel and the study pages of the
 * PDF): the table limit in amperes and, where the table states it in another unit, in that unit.
 * O(rows).
 *
 * @example predictionLimits(rows, { fundamentalA: 120, context: { ilA: 150 } }).tableLimitA(h5) // 10.5 (7 %IL of 150 A)
 */
export function predictionLimits(
  rows: readonly ComplianceRow[],
  base: { fundamentalA: number; irefA?: number; context?: Pick<EvaluationContext, "ilA" | "irefA" | "nominalVoltageV"> },
): PredictionLimits {
  const unit = rows.find((r) => r.limit !== null)?.unit ?? "A";
  const perUnitA = unitScale(unit, { fundamentalRms: base.fundamentalA, ilA: base.context?.ilA, irefA: base.irefA ?? base.context?.irefA, nominalVoltageV: base.context?.nominalVoltageV });
  const tableLimit = (row: ComplianceRow | undefined) => (row ? tableLimitOf(row) : null);
  return {
    unit,
    tableLimit,
    tableLimitA: (row) => {
      const limit = tableLimit(row);
      return limit === null || perUnitA === null ? null : limit * perUnitA;
    },
  };
}
