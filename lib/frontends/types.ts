// Shapes shared by the converter front-end models, the fitting and the diagnosis.
// A spectrum is per order 1..MAX_ORDER: r.m.s. relative to the fundamental (1 = 100 %) and phase
// relative to the supply voltage's fundamental (cosine convention, as the analysis reports phases:
// ψ_h = φ_I,h − h·φ_V,1, radians).

/** Highest order the models return. */
export const MAX_ORDER = 50;

export type FrontEndFamily =
  | "single-phase-capacitor"
  | "six-pulse-capacitor"
  | "six-pulse-inductor"
  | "thyristor-bridge"
  | "twelve-pulse"
  | "eighteen-pulse"
  | "symmetrical-angle"
  | "active-front-end"
  | "linear";

export const FRONT_END_FAMILIES: readonly FrontEndFamily[] = [
  "single-phase-capacitor",
  "six-pulse-capacitor",
  "six-pulse-inductor",
  "thyristor-bridge",
  "twelve-pulse",
  "eighteen-pulse",
  "symmetrical-angle",
  "active-front-end",
  "linear",
];

/** Line-current spectrum: index = order (index 0 unused). `magnitude[1]` is 1. */
export interface FrontEndSpectrum {
  /** I_h / I_1 (dimensionless). */
  magnitude: Float64Array;
  /** ψ_h in radians: phase of order h minus h × the voltage fundamental's phase. */
  phaseRad: Float64Array;
}

/** Parameters of a family, keyed by parameter name (units in the names). */
export type FrontEndParameters = Record<string, number>;

/** How one parameter of a family may vary during a fit. */
export interface ParameterSpec {
  name: string;
  /** Short label with unit, for people. */
  label: string;
  min: number;
  max: number;
  /** Coarse starting points of the fit (within [min, max]; on ties the earlier wins). */
  grid: readonly number[];
}

/** Model version stored with saved studies; raise when any model or fit changes its numbers. */
export const FRONT_END_MODEL_VERSION = "frontends-1";
