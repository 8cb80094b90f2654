import { captureParamsSchema } from "@/lib/api/params";
import { withAuth } from "@/lib/api/with-auth";
import { loadReportSheet } from "@/lib/reports/load-report-sheet";
import { csvResponse } from "@/lib/reports/responses";

// GET /api/captures/:id/sheet-csv — the per-order sheet as CSV (?evaluation=ID for an older evaluation)
export const GET = withAuth<{ id: string }>(
  async ({ req, params, user }) => {
    const { id } = captureParamsSchema.parse(params);
    return csvResponse(await loadReportSheet({ captureId: id, url: req.url, reader: user }));
  },
  { permission: "captures:read" },
);
