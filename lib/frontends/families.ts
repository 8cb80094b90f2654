import { activeFrontEndSpectrum } from "./active-front-end-spectrum";
import { complexSpectrum } from "./complex-spectrum";
import { currentSourceBridgeSpectrum } from "./current-source-bridge-spectrum";
import { decodeGrid, PRECOMPUTED_GRIDS } from "./grid-data";
import { interpolateGrid, type SpectrumGrid } from "./interpolate-grid";
import { multiPulseSpectrum } from "./multi-pulse-spectrum";
import { simulateSinglePhaseCapacitor } from "./simulate-single-phase-capacitor";
import { simulateSixPulseCapacitor } from "./simulate-six-pulse-capacitor";
import { symmetricalAngleSpectrum } from "./symmetrical-angle-spectrum";
import { MAX_ORDER, type FrontEndFamily, type FrontEndParameters, type FrontEndSpectrum, type ParameterSpec } from "./types";

/** One family: its parameters and how to compute its spectrum. */
export interface FamilyModel {
  family: FrontEndFamily;
  parameters: readonly ParameterSpec[];
  /** Spectrum at a parameter point; grid-backed families interpolate (fast, for fitting). */
  spectrum: (p: FrontEndParameters) => FrontEndSpectrum;
  /** Exact spectrum (a fresh simulation for simulated families); used for what-ifs. */
  exact: (p: FrontEndParameters) => FrontEndSpectrum;
}

export function gridOf(axes: readonly (readonly number[])[], compute: (point: number[]) => FrontEndSpectrum): SpectrumGrid {
  const re: Float64Array[] = [];
  const im: Float64Array[] = [];
  const walk = (d: number, point: number[]): void => {
    if (d === axes.length) {
      const s = compute(point);
      const r = new Float64Array(MAX_ORDER + 1);
      const i = new Float64Array(MAX_ORDER + 1);
      for (let h = 1; h <= MAX_ORDER; h++) {
        r[h] = s.magnitude[h]! * Math.cos(s.phaseRad[h]!);
        i[h] = s.magnitude[h]! * Math.sin(s.phaseRad[h]!);
      }
      re.push(r);
      im.push(i);
      return;
    }
    for (const x of axes[d]!) walk(d + 1, [...point, x]);
  };
  walk(0, []);
  return { axes, re, im };
}

/**
 * A grid from the precomputed data when its axes match (written by `npx tsx scripts/generate-frontend-grids.ts`;
 * a unit test re-simulates points of it), else simulated on first use.
 */
function lazyGrid(key: string, axes: readonly (readonly number[])[], compute: (point: number[]) => FrontEndSpectrum): () => SpectrumGrid {
  let grid: SpectrumGrid | null = null;
  return () => (grid ??= decodeGrid(PRECOMPUTED_GRIDS[key], axes) ?? gridOf(axes, compute));
}

/** The simulated families' grids, for the generator script: key → axes and how to compute a point. */
export const SIMULATED_GRIDS: Record<string, { axes: readonly (readonly number[])[]; compute: (point: number[]) => FrontEndSpectrum }> = {};

// Grids of the simulated families: precomputed (grid-data.ts), or simulated once per process on
// first use (≈ 1 s) when the axes changed; then interpolated. Axes are denser where the spectrum changes fastest (small inductance).
const SIX_PULSE_AC = [0.1, 0.2, 0.3, 0.4, 0.5, 0.6, 0.8, 1, 1.25, 1.5, 2, 2.5, 3, 4, 5, 6, 7, 8.5, 10] as const;
const SIX_PULSE_DC = [0, 1, 2.5, 5, 7.5, 10] as const;
// Inductance and load trade against each other in the current's shape (it follows ωL·I/V), so a
// spectrum cannot tell a 3 % reactor at full load from a 6 % one at half load: the fit takes the
// present load as the base (100 %) and the percentages are on it.
SIMULATED_GRIDS["six-pulse-capacitor"] = {
  axes: [SIX_PULSE_AC, SIX_PULSE_DC],
  compute: ([ac, dc]) => simulateSixPulseCapacitor({ acInductancePercent: ac!, dcChokePercent: dc!, loadPercent: 100 }),
};
const sixPulseGrid = lazyGrid("six-pulse-capacitor", SIMULATED_GRIDS["six-pulse-capacitor"].axes, SIMULATED_GRIDS["six-pulse-capacitor"].compute);
const SINGLE_L = [0.1, 0.2, 0.3, 0.45, 0.6, 0.8, 1, 1.5, 2, 3, 4, 5, 7, 10, 15, 20] as const;
const SINGLE_C = [3, 6, 12, 25, 50] as const;
SIMULATED_GRIDS["single-phase-capacitor"] = {
  axes: [SINGLE_L, SINGLE_C],
  compute: ([l, c]) => simulateSinglePhaseCapacitor({ lineInductancePercent: l!, capacitorPu: c! }),
};
const singlePhaseGrid = lazyGrid("single-phase-capacitor", SIMULATED_GRIDS["single-phase-capacitor"].axes, SIMULATED_GRIDS["single-phase-capacitor"].compute);

function fromGrid(grid: SpectrumGrid, point: number[]): FrontEndSpectrum {
  const { re, im } = interpolateGrid(grid, point);
  return complexSpectrum(re, im);
}

const p = (name: string, label: string, min: number, max: number, grid: readonly number[]): ParameterSpec => ({ name, label, min, max, grid });

const linearSpectrum = (displacementDeg: number): FrontEndSpectrum => {
  const magnitude = new Float64Array(MAX_ORDER + 1);
  const phaseRad = new Float64Array(MAX_ORDER + 1);
  magnitude[1] = 1;
  phaseRad[1] = (-displacementDeg * Math.PI) / 180;
  return { magnitude, phaseRad };
};

/**
 * The front-end families with their parameters (units in the names) and spectrum functions.
 * Ranges are those of equipment met in the field; fits stay inside them.
 */
export const FAMILY_MODELS: Readonly<Record<FrontEndFamily, FamilyModel>> = {
  "single-phase-capacitor": {
    family: "single-phase-capacitor",
    parameters: [p("lineInductancePercent", "line inductance (% on the load's base)", 0.1, 20, SINGLE_L), p("capacitorPu", "DC capacitor (ωC × base impedance)", 3, 50, SINGLE_C)],
    spectrum: (x) => fromGrid(singlePhaseGrid(), [x.lineInductancePercent!, x.capacitorPu!]),
    exact: (x) => simulateSinglePhaseCapacitor({ lineInductancePercent: x.lineInductancePercent!, capacitorPu: x.capacitorPu! }),
  },
  "six-pulse-capacitor": {
    family: "six-pulse-capacitor",
    parameters: [
      p("acInductancePercent", "AC inductance (% on the present load's base)", 0.1, 10, SIX_PULSE_AC),
      p("dcChokePercent", "DC choke (% AC-equivalent, on the present load's base)", 0, 10, SIX_PULSE_DC),
    ],
    spectrum: (x) => fromGrid(sixPulseGrid(), [x.acInductancePercent!, x.dcChokePercent!]),
    exact: (x) => simulateSixPulseCapacitor({ acInductancePercent: x.acInductancePercent!, dcChokePercent: x.dcChokePercent!, loadPercent: 100 }),
  },
  "six-pulse-inductor": {
    family: "six-pulse-inductor",
    parameters: [p("commutationReactancePercent", "commutation reactance (%)", 0, 20, [0, 1, 2, 3, 5, 7, 10, 14, 20])],
    spectrum: (x) => currentSourceBridgeSpectrum(0, x.commutationReactancePercent!),
    exact: (x) => currentSourceBridgeSpectrum(0, x.commutationReactancePercent!),
  },
  "thyristor-bridge": {
    family: "thyristor-bridge",
    parameters: [
      p("firingAngleDeg", "firing angle α (°)", 0, 85, [0, 10, 20, 30, 45, 60, 75, 85]),
      p("commutationReactancePercent", "commutation reactance (%)", 0, 20, [0, 2, 5, 10, 20]),
    ],
    spectrum: (x) => currentSourceBridgeSpectrum(x.firingAngleDeg!, x.commutationReactancePercent!),
    exact: (x) => currentSourceBridgeSpectrum(x.firingAngleDeg!, x.commutationReactancePercent!),
  },
  "twelve-pulse": {
    family: "twelve-pulse",
    parameters: [p("commutationReactancePercent", "commutation reactance (%)", 0, 20, [0, 2, 5, 10, 20]), p("imbalancePercent", "imbalance between bridges (%)", 0, 20, [0, 2, 5, 10, 20])],
    spectrum: (x) => multiPulseSpectrum(currentSourceBridgeSpectrum(0, x.commutationReactancePercent!), 12, x.imbalancePercent!),
    exact: (x) => multiPulseSpectrum(currentSourceBridgeSpectrum(0, x.commutationReactancePercent!), 12, x.imbalancePercent!),
  },
  "eighteen-pulse": {
    family: "eighteen-pulse",
    parameters: [p("commutationReactancePercent", "commutation reactance (%)", 0, 20, [0, 2, 5, 10, 20]), p("imbalancePercent", "imbalance between bridges (%)", 0, 20, [0, 2, 5, 10, 20])],
    spectrum: (x) => multiPulseSpectrum(currentSourceBridgeSpectrum(0, x.commutationReactancePercent!), 18, x.imbalancePercent!),
    exact: (x) => multiPulseSpectrum(currentSourceBridgeSpectrum(0, x.commutationReactancePercent!), 18, x.imbalancePercent!),
  },
  "symmetrical-angle": {
    family: "symmetrical-angle",
    parameters: [p("conductionWidthDeg", "conduction width β (°)", 10, 180, [10, 30, 60, 90, 120, 150, 180])],
    spectrum: (x) => symmetricalAngleSpectrum(x.conductionWidthDeg!),
    exact: (x) => symmetricalAngleSpectrum(x.conductionWidthDeg!),
  },
  "active-front-end": {
    family: "active-front-end",
    parameters: [
      p("lowOrderResidualPercent", "low-order residual (% of fundamental)", 0, 10, [0, 1, 2, 4, 7, 10]),
      p("switchingOrder", "switching frequency / fundamental", 20, 60, Array.from({ length: 41 }, (_, k) => 20 + k)),
      p("sidebandPercent", "main sideband (% of fundamental)", 0, 10, [0, 1, 2, 4, 7, 10]),
    ],
    spectrum: (x) => activeFrontEndSpectrum(x.lowOrderResidualPercent!, x.switchingOrder!, x.sidebandPercent!),
    exact: (x) => activeFrontEndSpectrum(x.lowOrderResidualPercent!, x.switchingOrder!, x.sidebandPercent!),
  },
  linear: {
    family: "linear",
    parameters: [p("displacementDeg", "displacement angle (°, + lagging)", -60, 60, [0, -15, 15, -30, 30, -45, 45])],
    spectrum: (x) => linearSpectrum(x.displacementDeg!),
    exact: (x) => linearSpectrum(x.displacementDeg!),
  },
};
