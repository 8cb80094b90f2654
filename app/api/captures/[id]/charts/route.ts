import { z } from "zod";
import { captureParamsSchema } from "@/lib/api/params";
import { gzipResponse } from "@/lib/api/gzip-response";
import { withAuth } from "@/lib/api/with-auth";
import { loadChartJson } from "@/lib/captures/load-sheet";

const querySchema = z.object({ evaluation: z.uuid("Not an evaluation id").optional() });

// GET /api/captures/:id/charts[?evaluation=ID] — waveform, spectrum and window-series data for the sheet's charts,
// sent as stored with the evaluation. Keyed by an evaluation id the answer never changes (evaluations are
// immutable), so the browser may keep it for a year; without one it is the newest evaluation's and is
// revalidated (its ETag is the evaluation's id).
export const GET = withAuth<{ id: string }>(
  async ({ req, params, user }) => {
    const { id } = captureParamsSchema.parse(params);
    const { evaluation } = querySchema.parse({ evaluation: req.nextUrl.searchParams.get("evaluation") ?? undefined });
    const charts = await loadChartJson({ captureId: id, reader: user, evaluationId: evaluation });
    return gzipResponse(req, charts, evaluation ? "private, max-age=31536000, immutable" : "private, no-cache");
  },
  { permission: "captures:read" },
);
