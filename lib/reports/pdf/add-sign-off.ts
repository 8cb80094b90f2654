import { formatWhen, reviewActionLabels } from "../format";
import { describeSignOff } from "../describe-sign-off";
import type { SheetReport } from "../sheet-report";
import type { PdfWriter } from "./pdf-writer";

/**
 * The "Sign-off" section: the review state, then each review action with who and when, and its
 * comment unless `includeComments` is false (share links: comments are internal). O(reviews).
 *
 * @example addSignOff(w, sheet, { includeComments: true })
 */
export function addSignOff(w: PdfWriter, sheet: SheetReport, { includeComments }: { includeComments: boolean }): void {
  w.heading("Sign-off");
  w.keyValues([["State", describeSignOff(sheet).label]]);
  if (sheet.reviews.length === 0) w.text("No review actions yet.");
  for (const r of sheet.reviews) {
    const who = r.actorName ?? "unknown";
    const comment = !includeComments || !r.comment ? "" : ` — "${r.comment}"`;
    w.keyValues([[formatWhen(r.createdAt), `${reviewActionLabels[r.action] ?? r.action} by ${who}${comment}`]]);
  }
}
