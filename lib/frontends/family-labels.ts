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
export const PARAMETER_LABELS: Readonly<Record<string, string>> = {
  lineInductancePercent: "line inductance, %",
  capacitorPu: "DC capacitor, ωC·Z",
  acInductancePercent: "AC reactance, %",
  dcChokePercent: "DC choke, %",
  commutationReactancePercent: "commutation reactance, %",
  firingAngleDeg: "firing angle, °",
  imbalancePercent: "bridge imbalance, %",
  conductionWidthDeg: "conduction width, °",
  lowOrderResidualPercent: "low-order residual, %",
  switchingOrder: "switching order",
  sidebandPercent: "sideband, %",
  displacementDeg: "displacement, °",
};
