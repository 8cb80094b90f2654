import { NextResponse } from "next/server";
import { captureParamsSchema } from "@/lib/api/params";
import { withAuth } from "@/lib/api/with-auth";
import { loadChartData } from "@/lib/captures/load-sheet";

// GET /api/captures/:id/charts — waveform, spectrum and window-series data for the sheet's charts
export const GET = withAuth<{ id: string }>(
  async ({ params, user }) => {
    const { id } = captureParamsSchema.parse(params);
    return NextResponse.json(await loadChartData({ captureId: id, reader: user }));
  },
  { permission: "captures:read" },
);
