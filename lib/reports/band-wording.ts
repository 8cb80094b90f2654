// The band choice in words: what a context must give to choose a band, a criterion's value as
// quoted against a band's bounds, and why no band applies. With result-wording.ts, the one place
// the evaluation's words are made; the evaluator (select-band) calls it. Relative imports: the
// evaluator and the CLI import this file too.
import type { BandCriterion } from "../compliance/result";
import { joinAnd } from "./result-wording";

/** What the user must give to choose a band by each criterion, in a reader's words. */
const CRITERION_NEEDS: Record<BandCriterion, string> = {
  iscOverIl: "Isc and IL (for Isc/IL)",
  busVoltageV: "the bus voltage",
  rsce: "Rsce",
  ratedPowerW: "the rated power P",
  phaseConfig: "the phase configuration",
};

/** A criterion's name and unit where its value is quoted ("bus voltage = 11000 V"). */
export const CRITERION_NAMES: Record<BandCriterion, { name: string; unit: string }> = {
  iscOverIl: { name: "Isc/IL", unit: "" },
  busVoltageV: { name: "bus voltage", unit: " V" },
  rsce: { name: "Rsce", unit: "" },
  ratedPowerW: { name: "rated power", unit: " W" },
  phaseConfig: { name: "phase configuration", unit: "" },
};

const PHASE_CONFIG_WORDS: Record<string, string> = {
  "single-phase": "single-phase",
  "balanced-three-phase": "balanced three-phase",
  other: "other than single-phase or balanced three-phase",
};

/** A phase configuration of the context in words ("balanced three-phase"). */
export function phaseConfigText(value: string): string {
  return PHASE_CONFIG_WORDS[value] ?? value;
}

/**
 * A context value quoted against a band's bounds: whole numbers as they are, others to six
 * significant figures (not the four of formatNumber), so a value just below a bound
 * (Isc/IL = 49.9996) never prints as the bound itself. O(1).
 *
 * @example formatContextValue(49.99963) // "49.9996"
 */
export function formatContextValue(value: number): string {
  return Number.isInteger(value) ? String(value) : String(Number(value.toPrecision(6)));
}

/** "bus voltage = 11000 V", "phase configuration balanced three-phase". */
export function criterionValueText(criterion: BandCriterion, value: number | string): string {
  const { name, unit } = CRITERION_NAMES[criterion];
  if (typeof value === "string") return `${name} ${criterion === "phaseConfig" ? phaseConfigText(value) : value}`;
  return `${name} = ${formatContextValue(value)}${unit}`;
}

/**
 * Why no band was chosen because inputs are missing.
 *
 * @example bandNotChosenText(["busVoltageV", "iscOverIl"], 13) // "band not chosen: the bus voltage and Isc and IL (for Isc/IL) not given (needed to choose among the 13 bands of this limit set)"
 */
export function bandNotChosenText(missing: BandCriterion[], bandCount: number): string {
  return `band not chosen: ${joinAnd(missing.map((criterion) => CRITERION_NEEDS[criterion]))} not given (needed to choose among the ${bandCount} bands of this limit set)`;
}

/** Why no band applies: the context's values of the criteria the set's bands use, and the bands there are. */
export function noBandText(values: Array<[BandCriterion, number | string]>, bandLabels: string[]): string {
  const given = values.length > 0 ? values.map(([criterion, value]) => criterionValueText(criterion, value)).join(", ") : "this context";
  return `no band of this limit set applies to ${given}; its bands: ${bandLabels.join("; ")}`;
}
