import { NextResponse } from "next/server";
import { z } from "zod";
import { captureParamsSchema } from "@/lib/api/params";
import { withAuth } from "@/lib/api/with-auth";
import { loadChartData } from "@/lib/captures/load-sheet";

const querySchema = z.object({ evaluation: z.uuid("Not an evaluation id").optional() });

// GET /api/captures/:id/charts[?evaluation=ID] — waveform, spectrum and window-series data for the sheet's charts.
// Keyed by an evaluation id the answer never changes (evaluations are immutable), so the browser may keep it
// for a year; without one it is the newest evaluation's and is revalidated.
export const GET = withAuth<{ id: string }>(
  async ({ req, params, user }) => {
    const { id } = captureParamsSchema.parse(params);
    const { evaluation } = querySchema.parse({ evaluation: req.nextUrl.searchParams.get("evaluation") ?? undefined });
    const data = await loadChartData({ captureId: id, reader: user, evaluationId: evaluation });
    return NextResponse.json(data, {
      headers: { "cache-control": evaluation ? "private, max-age=31536000, immutable" : "private, no-cache", vary: "cookie" },
    });
  },
  { permission: "captures:read" },
);
