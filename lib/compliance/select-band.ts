// Choosing the applicability band of a limit set for an evaluation context, with a reason a
// reviewer can check ("Isc/IL = 50 exactly → 50 ≤ Isc/IL < 100 because …").
import { bandNotChosenText, CRITERION_NAMES, criterionValueText, formatContextValue, noBandText, phaseConfigText } from "../reports/band-wording";
import type { Band, EvaluationContext, LimitSetRevisionContent, Range } from "./model";
import type { BandCriterion } from "./result";

type Criterion = BandCriterion;
const CRITERIA = ["busVoltageV", "phaseConfig", "iscOverIl", "rsce", "ratedPowerW"] as const;

export type BandSelection =
  | {
      status: "chosen";
      /** One band, or several alternatives of one option group (comply with any one). */
      bands: Band[];
      reason: string;
    }
  | {
      status: "missing-context";
      /** Criteria the context does not answer, which prevents the choice. */
      missing: Criterion[];
      /** Bands still possible; their orders are listed as not evaluated. */
      candidates: Band[];
      reason: string;
    }
  | { status: "no-band"; reason: string };

/**
 * Describe a range in words, e.g. `50 ≤ Isc/IL < 100`.
 *
 * @example
 * describeRange({ min: 50, max: 100, minInclusive: true, maxInclusive: false }, "Isc/IL") // "50 ≤ Isc/IL < 100"
 */
export function describeRange(range: Range, name: string, unit = ""): string {
  const lower = range.min === undefined ? "" : `${range.min}${unit} ${range.minInclusive ? "≤" : "<"} `;
  const upper = range.max === undefined ? "" : ` ${range.maxInclusive ? "≤" : "<"} ${range.max}${unit}`;
  return `${lower}${name}${upper}`;
}

function inRange(value: number, range: Range): boolean {
  if (range.min !== undefined && (range.minInclusive ? value < range.min : value <= range.min)) return false;
  if (range.max !== undefined && (range.maxInclusive ? value > range.max : value >= range.max)) return false;
  return true;
}

/** Values of the band criteria in this context (Isc/IL derived from iscA and ilA). */
function criterionValues(context: EvaluationContext): Partial<Record<Criterion, number | string>> {
  return {
    iscOverIl: context.iscA !== undefined && context.ilA !== undefined ? context.iscA / context.ilA : undefined,
    busVoltageV: context.busVoltageV,
    rsce: context.rsce,
    ratedPowerW: context.ratedPowerW,
    phaseConfig: context.phaseConfig,
  };
}

type Check = { result: "match"; text: string } | { result: "mismatch" } | { result: "unknown"; needs: Criterion };

function checkBand(band: Band, context: EvaluationContext, generatorOverride: boolean): Check[] {
  const values = criterionValues(context);
  const checks: Check[] = [];
  const { applicability } = band;
  for (const criterion of CRITERIA) {
    if (criterion === "phaseConfig") {
      const allowed = applicability.phaseConfig;
      if (!allowed) continue;
      const value = context.phaseConfig;
      if (value === undefined) checks.push({ result: "unknown", needs: "phaseConfig" });
      else if (allowed.includes(value)) checks.push({ result: "match", text: `phase configuration ${phaseConfigText(value)}` });
      else checks.push({ result: "mismatch" });
      continue;
    }
    const range = applicability[criterion];
    if (!range) continue;
    if (criterion === "iscOverIl" && generatorOverride) {
      checks.push(
        band.generatorBand
          ? { result: "match", text: "power-generation equipment: first row regardless of Isc/IL (IEEE 519 note c)" }
          : { result: "mismatch" },
      );
      continue;
    }
    const value = values[criterion] as number | undefined;
    if (value === undefined) {
      checks.push({ result: "unknown", needs: criterion });
      continue;
    }
    if (!inRange(value, range)) {
      checks.push({ result: "mismatch" });
      continue;
    }
    const { name, unit } = CRITERION_NAMES[criterion];
    const shown = criterion === "iscOverIl" ? `${criterionValueText(criterion, value)} (${context.iscA} A / ${context.ilA} A)` : criterionValueText(criterion, value);
    let text = `${shown} is in ${describeRange(range, name, unit)}`;
    const atBound = value === range.min || value === range.max;
    if (atBound) {
      // Plain words from the typed bounds; the limit set's own boundary text (with its provenance)
      // stays in the limit-table screens, and its interpretation is in the limit set's notes.
      const atLower = value === range.min;
      text += ` — exactly at the bound ${formatContextValue(value)}, which this band includes as its ${atLower ? "lower" : "upper"} bound, so a value on the bound uses the ${atLower ? "higher" : "lower"} row (this one)`;
    }
    checks.push({ result: "match", text });
  }
  return checks;
}

/**
 * Pick the applicability band(s) of a limit-set revision for an evaluation context.
 *
 * Every criterion a band states must hold; a criterion the context cannot answer makes the
 * choice `missing-context` (never a silent default). Several matching bands must be options of
 * one group (e.g. IEC 61000-3-2 Class C 5–25 W options a/b). O(bands × criteria).
 *
 * @example
 * selectBand(ieee519Content, { busVoltageV: 480, iscA: 5000, ilA: 100 })
 * // { status: "chosen", bands: [Table 2, 50 ≤ Isc/IL < 100], reason: "bus voltage = 480 V is in …; Isc/IL = 50 … exactly at the bound 50: …" }
 */
export function selectBand(content: LimitSetRevisionContent, context: EvaluationContext): BandSelection {
  const generatorOverride = context.isGenerator === true && content.bands.some((band) => band.generatorBand);
  const matched: Array<{ band: Band; texts: string[] }> = [];
  const unknown: Array<{ band: Band; needs: Criterion[] }> = [];
  for (const band of content.bands) {
    const checks = checkBand(band, context, generatorOverride);
    if (checks.some((check) => check.result === "mismatch")) continue;
    const needs = checks.flatMap((check) => (check.result === "unknown" ? [check.needs] : []));
    if (needs.length > 0) unknown.push({ band, needs });
    else matched.push({ band, texts: checks.flatMap((check) => (check.result === "match" ? [check.text] : [])) });
  }

  if (unknown.length > 0) {
    const missing = [...new Set(unknown.flatMap((entry) => entry.needs))];
    return {
      status: "missing-context",
      missing,
      candidates: [...matched.map((entry) => entry.band), ...unknown.map((entry) => entry.band)],
      reason: bandNotChosenText(missing, unknown.length + matched.length),
    };
  }
  if (matched.length === 0) {
    // Only the criteria this set's bands are chosen by (Isc/IL means nothing to a Class D table).
    const used = new Set(content.bands.flatMap((band) => CRITERIA.filter((criterion) => band.applicability[criterion] !== undefined)));
    const all = criterionValues(context);
    const values = CRITERIA.filter((criterion) => used.has(criterion) && all[criterion] !== undefined).map((criterion): [Criterion, number | string] => [criterion, all[criterion]!]);
    return { status: "no-band", reason: noBandText(values, content.bands.map((band) => band.label)) };
  }
  const groups = new Set(matched.map((entry) => entry.band.option?.group ?? `(no option) ${entry.band.label}`));
  if (matched.length > 1 && groups.size > 1) {
    throw new Error(
      `limit set ${content.key} is ambiguous: bands ${matched.map((entry) => `"${entry.band.label}"`).join(", ")} all apply`,
    );
  }
  const first = matched[0] as { band: Band; texts: string[] };
  const because = first.texts.length > 0 ? first.texts.join("; ") : "the limit set has one band for all cases";
  const reason =
    matched.length === 1
      ? because
      : `${matched.length} alternative options, compliance with any one suffices: ${matched
          .map((entry) => `${entry.band.label} (${entry.texts.join("; ") || "no criteria"})`)
          .join(" | ")}`;
  return { status: "chosen", bands: matched.map((entry) => entry.band), reason };
}
