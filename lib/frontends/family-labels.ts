import type { FrontEndFamily } from "./types";

/** Short names of the families for people (client-safe: no model code). */
export const FAMILY_LABELS: Readonly<Record<FrontEndFamily, string>> = {
  "single-phase-capacitor": "Single-phase rectifier + DC capacitor",
  "six-pulse-capacitor": "Six-pulse diode bridge + DC capacitor",
  "six-pulse-inductor": "Six-pulse bridge + large DC inductance",
  "thyristor-bridge": "Phase-controlled thyristor bridge",
  "twelve-pulse": "Twelve-pulse converter",
  "eighteen-pulse": "Eighteen-pulse converter",
  "symmetrical-angle": "Single-phase bridge, symmetrical conduction angle",
  "active-front-end": "Active front end (PWM rectifier)",
  linear: "Linear load",
};

/** Parameter names with their units, for people. */
export const PARAMETER_LABELS: Readonly<Record<string, { label: string; unit: string }>> = {
  lineInductancePercent: { label: "line inductance", unit: "%" },
  capacitorPu: { label: "DC capacitor ωC·Z", unit: "" },
  acInductancePercent: { label: "AC reactance", unit: "%" },
  dcChokePercent: { label: "DC choke", unit: "%" },
  commutationReactancePercent: { label: "commutation reactance", unit: "%" },
  firingAngleDeg: { label: "firing angle", unit: "°" },
  imbalancePercent: { label: "bridge imbalance", unit: "%" },
  conductionWidthDeg: { label: "conduction width", unit: "°" },
  lowOrderResidualPercent: { label: "low-order residual", unit: "%" },
  switchingOrder: { label: "switching order", unit: "" },
  sidebandPercent: { label: "sideband", unit: "%" },
  displacementDeg: { label: "displacement", unit: "°" },
};
