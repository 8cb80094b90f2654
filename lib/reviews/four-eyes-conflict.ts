// Four-eyes rule of a sign-off. Pure.

export type ResultPart = "set-up" | "analysis" | "evaluation";

/**
 * Which parts of the result being approved the would-be approver made themselves — the set-up
 * (mapping, scales, context), the analysis run or the evaluation — or an empty list when they made
 * none and may approve. No role is exempt. O(1).
 *
 * @example fourEyesConflict({ approverId: "u1", setupBy: "u1", analysedBy: "u2", evaluatedBy: "u2" }) // ["set-up"]
 */
export function fourEyesConflict({
  approverId,
  setupBy,
  analysedBy,
  evaluatedBy,
}: {
  approverId: string;
  setupBy: string | null;
  analysedBy: string | null;
  evaluatedBy: string | null;
}): ResultPart[] {
  const parts: ResultPart[] = [];
  if (setupBy === approverId) parts.push("set-up");
  if (analysedBy === approverId) parts.push("analysis");
  if (evaluatedBy === approverId) parts.push("evaluation");
  return parts;
}
