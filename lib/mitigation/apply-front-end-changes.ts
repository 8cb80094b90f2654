import { FAMILY_MODELS } from "../frontends/families";
import { multiPulseSpectrum } from "../frontends/multi-pulse-spectrum";
import { currentSourceBridgeSpectrum } from "../frontends/current-source-bridge-spectrum";
import type { FrontEndSpectrum } from "../frontends/types";
import type { FittedFrontEnd, Mitigation } from "./types";

const SIX_PULSE_FAMILIES = new Set(["six-pulse-capacitor", "six-pulse-inductor", "thyristor-bridge"]);

/**
 * The fitted front end's spectrum before and after the load-side mitigations (AC line reactor,
 * DC choke, conversion to 12/18 pulses), re-simulated with the added inductance. Mitigations that
 * do not apply to the family are skipped with a warning.
 *
 * @example applyFrontEndChanges({ family: "six-pulse-capacitor", parameters: { acInductancePercent: 0.5, dcChokePercent: 0, loadPercent: 100 } }, [{ kind: "reactor", percent: 5 }])
 */
export function applyFrontEndChanges(fitted: FittedFrontEnd, mitigations: readonly Mitigation[]): { before: FrontEndSpectrum; after: FrontEndSpectrum; changed: boolean; warnings: string[] } {
  const model = FAMILY_MODELS[fitted.family];
  const before = model.exact(fitted.parameters);
  const params = { ...fitted.parameters };
  let family = fitted.family;
  let pulses: { pulses: 12 | 18; imbalancePercent: number } | null = null;
  const warnings: string[] = [];
  let changed = false;
  for (const m of mitigations) {
    if (m.kind === "reactor") {
      if (family === "six-pulse-capacitor") params.acInductancePercent = params.acInductancePercent! + m.percent;
      else if (family === "single-phase-capacitor") params.lineInductancePercent = params.lineInductancePercent! + m.percent;
      else if ("commutationReactancePercent" in params) params.commutationReactancePercent = params.commutationReactancePercent! + m.percent;
      else {
        warnings.push(`a ${m.percent} % line reactor is not modelled for a ${family} front end; left out`);
        continue;
      }
      changed = true;
    } else if (m.kind === "dc-choke") {
      if (family === "six-pulse-capacitor") {
        params.dcChokePercent = params.dcChokePercent! + m.percent;
        changed = true;
      } else warnings.push(`a DC choke is not modelled for a ${family} front end${"commutationReactancePercent" in params ? " (its DC current is already smooth)" : ""}; left out`);
    } else if (m.kind === "multi-pulse") {
      if (SIX_PULSE_FAMILIES.has(family) || family === "twelve-pulse" || family === "eighteen-pulse") {
        pulses = { pulses: m.pulses, imbalancePercent: m.imbalancePercent };
        if (family === "twelve-pulse" || family === "eighteen-pulse") family = "six-pulse-inductor";
        changed = true;
      } else warnings.push(`a ${m.pulses}-pulse conversion applies to three-phase six-pulse front ends, not to ${family}; left out`);
    }
  }
  let after = changed ? (family === fitted.family ? model.exact(params) : currentSourceBridgeSpectrum(0, params.commutationReactancePercent!)) : before;
  if (pulses) after = multiPulseSpectrum(after, pulses.pulses, pulses.imbalancePercent);
  return { before, after, changed, warnings };
}
