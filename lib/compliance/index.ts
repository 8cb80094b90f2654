// Public API of the compliance layer (pure: no framework, database or storage imports).
export { evaluateCompliance, type EvaluateComplianceInput } from "./evaluate-compliance";
export { formatComplianceTable } from "./format-compliance-table";
export { evaluateFormula } from "./evaluate-formula";
export { parseFormula, FormulaSyntaxError, FormulaVariableError, FORMULA_VARIABLES } from "./parse-formula";
export { selectBand, type BandSelection } from "./select-band";
export { seedLimitSets, getSeedLimitSet, type SeedLimitSet } from "./seed";
export * from "./model";
export { orderMatchesParity } from "./order-matches-parity";
export type * from "./result";
