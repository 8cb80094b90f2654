import { z } from "zod";
import { gzipResponse } from "@/lib/api/gzip-response";
import { captureParamsSchema } from "@/lib/api/params";
import { withAuth } from "@/lib/api/with-auth";
import { loadSheetBody } from "@/lib/captures/load-sheet";

const querySchema = z.object({
  evaluation: z.uuid("Not an evaluation id"),
  channel: z
    .string()
    .max(200, "At most 200 characters")
    // eslint-disable-next-line no-control-regex
    .regex(/^[^\u0000-\u001f\u007f]*$/, "Contains a control character")
    .optional(),
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
