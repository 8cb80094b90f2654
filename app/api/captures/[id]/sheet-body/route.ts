import { z } from "zod";
import { gzipResponse } from "@/lib/api/gzip-response";
import { captureParamsSchema } from "@/lib/api/params";
import { withAuth } from "@/lib/api/with-auth";
import { singleLineText } from "@/lib/validations/text";
import { loadSheetBody } from "@/lib/captures/load-sheet";

const querySchema = z.object({
  evaluation: z.uuid("Not an evaluation id"),
  channel: singleLineText().max(200, "At most 200 characters").optional(),
});

// GET /api/captures/:id/sheet-body?evaluation=ID[&channel=NAME] — the per-order part of the sheet (channel list,
// the shown channel's aggregates, time rules and rows) that the sheet page's client renders, sent gzipped as
// stored with the evaluation. Keyed by an evaluation id it never changes (evaluations are immutable), so the
// browser may keep it for a year (ETag: evaluation and channel part); who may read it is decided on every request.
export const GET = withAuth<{ id: string }>(
  async ({ req, params, user }) => {
    const { id } = captureParamsSchema.parse(params);
    const search = req.nextUrl.searchParams;
    const { evaluation, channel } = querySchema.parse({ evaluation: search.get("evaluation") ?? undefined, channel: search.get("channel") ?? undefined });
    return gzipResponse(req, await loadSheetBody({ captureId: id, evaluationId: evaluation, channel, reader: user }), "private, max-age=31536000, immutable");
  },
  { permission: "captures:read" },
);
