import { parseFormula, type CompiledFormula, type FormulaVariables } from "./parse-formula";

// Limit tables evaluate the same few formulas for every order of every channel: parse once.
const cache = new Map<string, CompiledFormula>();

/**
 * Evaluate a limit formula (e.g. `0.15*15/h`, `30*lambda`, `3.85/h`) for the given variables.
 *
 * The result is in whatever unit the row's basis says (A, mA/W, % …); this function only
 * does the arithmetic. Throws `FormulaSyntaxError` (with the position) for an invalid
 * formula and `FormulaVariableError` when a used variable has no value. O(length) on the
 * first call for a formula, O(nodes) afterwards.
 *
 * @example
 * evaluateFormula("0.23*8/h", { h: 40 }) // 0.046 (A, IEC 61000-3-2 Class A, even orders)
 */
export function evaluateFormula(formula: string, variables: FormulaVariables): number {
  let compiled = cache.get(formula);
  if (!compiled) {
    compiled = parseFormula(formula);
    cache.set(formula, compiled);
  }
  return compiled.evaluate(variables);
}
