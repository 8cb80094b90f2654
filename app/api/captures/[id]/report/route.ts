import { listMitigationStudies } from "@/db/queries/studies";
import { captureParamsSchema } from "@/lib/api/params";
import { withAuth } from "@/lib/api/with-auth";
import { loadReportSheet } from "@/lib/reports/load-report-sheet";
import { pdfResponse } from "@/lib/reports/responses";

// GET /api/captures/:id/report — the sheet as a PDF (?evaluation=ID for an older evaluation), with the saved
// studies of that evaluation chosen for the report
export const GET = withAuth<{ id: string }>(
  async ({ req, params, user }) => {
    const { id } = captureParamsSchema.parse(params);
    const sheet = await loadReportSheet({ captureId: id, url: req.url, reader: user });
    // Only the studies started from the evaluation this PDF shows (for a viewer: the approved one).
    return pdfResponse(sheet, { studies: await listMitigationStudies({ captureId: id, onlyForReport: true, evaluationId: sheet.evaluation?.id ?? null }) });
  },
  { permission: "captures:read" },
);
