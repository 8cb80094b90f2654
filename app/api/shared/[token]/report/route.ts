import { listMitigationStudies } from "@/db/queries/studies";
import { withPublic } from "@/lib/api/with-auth";
import { AppError } from "@/lib/errors";
import { loadSharedSheet } from "@/lib/reports/load-shared-sheet";
import { pdfResponse } from "@/lib/reports/responses";

// GET /api/shared/:token/report — the shared sheet as a PDF; no session, the token is the key
export const GET = withPublic<{ token: string }>(async ({ params }) => {
  const sheet = await loadSharedSheet({ token: params.token });
  if (!sheet.evaluation) throw new AppError("not_found", "This link is no longer valid.");
  // Review comments are internal to the team; the shared PDF shows only who did what and when.
  // The studies chosen for the report that started from the evaluation shown (the approved one), as a viewer's PDF has them.
  const studies = await listMitigationStudies({ captureId: sheet.capture.id, onlyForReport: true, evaluationId: sheet.evaluation.id });
  return pdfResponse(sheet, { includeComments: false, studies });
});
