import type { EvaluationContext } from "@/lib/compliance/model";

/** The numeric evaluation-context fields, as every form that edits a context shows them. */
export const contextNumberFields: Array<{ key: keyof EvaluationContext; label: string; unit: string; hint: string }> = [
  { key: "iscA", label: "Isc", unit: "A", hint: "maximum short-circuit current at the PCC" },
  { key: "ilA", label: "IL", unit: "A", hint: "maximum demand load current" },
  { key: "irefA", label: "Iref", unit: "A", hint: "IEC 61000-3-12; blank = measured r.m.s." },
  { key: "rsce", label: "Rsce", unit: "", hint: "short-circuit ratio, IEC 61000-3-12" },
  { key: "ratedPowerW", label: "Rated power", unit: "W", hint: "IEC 61000-3-2 Class C/D" },
  { key: "lambda", label: "Power factor λ", unit: "", hint: "Class C, 0–1; blank = measured" },
  { key: "nominalVoltageV", label: "Nominal voltage", unit: "V", hint: "of the voltage channels, as measured (line-to-neutral)" },
  { key: "busVoltageV", label: "Bus voltage", unit: "V", hint: "line-to-line at the PCC; picks the IEEE 519 table" },
];
