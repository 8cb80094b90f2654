import { listMitigationStudies } from "@/db/queries/studies";
import { captureParamsSchema } from "@/lib/api/params";
import { withAuth } from "@/lib/api/with-auth";
import { loadReportSheet } from "@/lib/reports/load-report-sheet";
import { pdfResponse } from "@/lib/reports/responses";

// GET /api/captures/:id/report — the sheet as a PDF (?evaluation=ID for an older evaluation)
export const GET = withAuth<{ id: string }>(
  async ({ req, params, user }) => {
    const { id } = captureParamsSchema.parse(params);
    const sheet = await loadReportSheet({ captureId: id, url: req.url, reader: user });
    return pdfResponse(sheet, { studies: await listMitigationStudies({ captureId: id, onlyForReport: true }) });
  },
  { permission: "captures:read" },
);
