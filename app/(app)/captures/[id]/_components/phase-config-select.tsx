import type { SelectHTMLAttributes } from "react";

/**
 * The phase-configuration choice of an evaluation context, shared by the re-evaluate form (uncontrolled, `name` +
 * `defaultValue`) and the setup form (controlled, `value` + `onChange`). The empty value means "not given".
 */
export function PhaseConfigSelect(props: Omit<SelectHTMLAttributes<HTMLSelectElement>, "children" | "className">) {
  return (
    <select {...props} className="field-input">
      <option value="">Not given</option>
      <option value="single-phase">Single-phase</option>
      <option value="balanced-three-phase">Balanced three-phase</option>
      <option value="other">Other</option>
    </select>
  );
}
