import type { AnalysisResult } from "../analysis/types";
import { evaluateCompliance } from "./evaluate-compliance";
import { formatComplianceTable } from "./format-compliance-table";
import { EvaluationContextSchema, type EvaluationContext } from "./model";
import type { ComplianceResult } from "./result";
import { getSeedLimitSet, seedLimitSets } from "./seed";

/**
 * Evaluate an analysis against a seed limit set chosen by key — the CLI's `--limits KEY`.
 *
 * Returns the result (for `--json`, as `compliance`) and the text sheet. Throws a one-line
 * error naming the known keys for an unknown key, and a zod error for an invalid context.
 * Seed sets carry revision `{ id: "seed:<key>", number: 1 }`.
 *
 * @example
 * const { compliance, table } = complianceForCli(analysis, "ieee-519-2014-current", { iscA: 20000, ilA: 500, busVoltageV: 480 });
 * console.log(table);
 */
export function complianceForCli(
  analysis: AnalysisResult,
  key: string,
  context: EvaluationContext = {},
): { compliance: ComplianceResult; table: string } {
  const set = getSeedLimitSet(key);
  if (!set) {
    throw new Error(`unknown limit set "${key}"; known: ${seedLimitSets.map((candidate) => candidate.key).join(", ")}`);
  }
  const compliance = evaluateCompliance({
    analysis,
    limitSet: { key: set.key, name: set.name, revision: { id: `seed:${set.key}`, number: 1 }, content: set.content },
    context: EvaluationContextSchema.parse(context),
  });
  return { compliance, table: formatComplianceTable(compliance) };
}
