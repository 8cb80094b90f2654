// Sign-off wording shared by the sheet page, the share page and the PDF, so all three say the same.
import { formatWhen, reviewStateLabels } from "./format";

export interface SignOffInput {
  capture: { reviewState: string; approvedEvaluationId?: string | null };
  evaluation: { id: string } | null;
  approval?: { actorName: string | null; createdAt: Date; comment: string } | null;
}

/**
 * The sign-off line of a sheet: "Approved by … on …" only when the shown evaluation is the one an
 * engineer approved; a newer, unapproved evaluation never inherits that word.
 *
 * @example describeSignOff({ capture: { reviewState: "in_review" }, evaluation: { id: "e1" } }) // { approved: false, label: "In review" }
 */
export function describeSignOff(sheet: SignOffInput): { approved: boolean; label: string } {
  const { capture, evaluation, approval } = sheet;
  if (evaluation && approval && capture.approvedEvaluationId === evaluation.id) {
    return { approved: true, label: `Approved by ${approval.actorName ?? "an engineer"} on ${formatWhen(approval.createdAt)}` };
  }
  if (capture.reviewState === "approved" || (capture.approvedEvaluationId && evaluation && capture.approvedEvaluationId !== evaluation.id)) {
    return { approved: false, label: "Not approved — a newer result than the approved one" };
  }
  return { approved: false, label: reviewStateLabels[capture.reviewState] ?? capture.reviewState };
}

