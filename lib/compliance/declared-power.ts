// IEC 61000-3-2 Class C and D: which power the limits use — the manufacturer's declared (rated)
// power, or the measured active power.
import type { AnalysisResult } from "../analysis/types";
import type { LimitSetRevisionContent } from "./model";
import { parseFormula } from "./parse-formula";
import type { PowerChoice } from "./result";

/** Declared power is used only within this fraction of the measured active power. */
export const DECLARED_POWER_TOLERANCE = 0.1;

/**
 * The measured active power of the equipment a current channel belongs to, W: the total of a
 * three-phase set, else the V–I pair of this channel; null when no voltage was recorded or the
 * power is not positive (a reversed clamp is not a load).
 */
export function measuredActivePowerW(analysis: AnalysisResult, channelName: string): number | null {
  const total = analysis.power.total?.activePowerW;
  const pair = analysis.power.phases.find((phase) => phase.current === channelName)?.activePowerW;
  const measured = total ?? pair;
  return measured !== undefined && Number.isFinite(measured) && measured > 0 ? measured : null;
}

/**
 * The power that chooses and scales the limits. IEC 61000-3-2:2018+A1:2020 (clause 6.2, and the
 * Class C/D limits in W or mA/W; from memory): the manufacturer's declared power is used when
 * it lies within ±10 % of the measured active power; otherwise the measured value is used.
 * With no measurement the declared value is used (and said so); with no declaration, the
 * measured value. O(1).
 *
 * @example
 * choosePower(600, 300) // { declaredW: 600, measuredW: 300, usedW: 300, rule: "measured-declared-outside-tolerance", … }
 * choosePower(330, 300) // usedW 330: 330 W is exactly +10 % of 300 W
 */
export function choosePower(declaredW: number | undefined, measuredW: number | null): PowerChoice {
  const base = { declaredW: declaredW ?? null, measuredW, tolerancePercent: DECLARED_POWER_TOLERANCE * 100 };
  if (declaredW === undefined && measuredW === null) return { ...base, usedW: null, rule: "none" };
  if (declaredW === undefined) return { ...base, usedW: measuredW, rule: "measured-no-declaration" };
  if (measuredW === null) return { ...base, usedW: declaredW, rule: "declared-not-measured" };
  const deviationPercent = ((declaredW - measuredW) / measuredW) * 100;
  // The relative 1e-9 keeps exactly ±10 % (330 W against 300 W) inside despite binary rounding.
  const within = Math.abs(declaredW - measuredW) <= DECLARED_POWER_TOLERANCE * measuredW * (1 + 1e-9);
  return within
    ? { ...base, usedW: declaredW, rule: "declared-within-tolerance", deviationPercent }
    : { ...base, usedW: measuredW, rule: "measured-declared-outside-tolerance", deviationPercent };
}

function formulaUsesP(formula: string | undefined): boolean {
  if (formula === undefined) return false;
  try {
    return parseFormula(formula).variables.includes("P");
  } catch {
    return false;
  }
}

/** Whether a revision's limits depend on rated power: a band chosen by it, mA/W rows, or formulas of P. */
export function usesRatedPower(content: LimitSetRevisionContent): boolean {
  return content.bands.some(
    (band) =>
      band.applicability.ratedPowerW !== undefined ||
      band.orderRows.some((row) => row.basis === "mA/W" || formulaUsesP(row.formula) || formulaUsesP(row.capFormulaA)) ||
      band.aggregates.some((aggregate) => aggregate.basis === "mA/W" || formulaUsesP(aggregate.formula)),
  );
}
