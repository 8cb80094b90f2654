import { NextResponse } from "next/server";
import { captureParamsSchema } from "@/lib/api/params";
import { withAuth } from "@/lib/api/with-auth";
import { loadChartData } from "@/lib/captures/load-sheet";
import { reportQuery } from "@/lib/reports/responses";

// GET /api/captures/:id/charts — waveform, spectrum and window-series data for the sheet's charts
// (?evaluation=ID for the analysis behind another evaluation than the approved/newest one)
export const GET = withAuth<{ id: string }>(
  async ({ req, params, user }) => {
    const { id } = captureParamsSchema.parse(params);
    const { evaluation } = reportQuery(req.url);
    return NextResponse.json(await loadChartData({ captureId: id, role: user.role, evaluationId: evaluation }));
  },
  { permission: "captures:read" },
);
