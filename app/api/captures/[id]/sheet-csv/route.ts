import { captureParamsSchema } from "@/lib/api/params";
import { withAuth } from "@/lib/api/with-auth";
import { loadSheet } from "@/lib/captures/load-sheet";
import { AppError } from "@/lib/errors";
import { csvResponse, reportQuery } from "@/lib/reports/responses";

// GET /api/captures/:id/sheet-csv — the per-order sheet as CSV (?evaluation=ID for an older evaluation)
export const GET = withAuth<{ id: string }>(
  async ({ req, params, user }) => {
    const { id } = captureParamsSchema.parse(params);
    const { evaluation } = reportQuery(req.url);
    const sheet = await loadSheet({ captureId: id, evaluationId: evaluation, reader: user });
    if (!sheet.evaluation) throw new AppError("conflict", "The capture has not been evaluated yet.");
    return csvResponse(sheet);
  },
  { permission: "captures:read" },
);
