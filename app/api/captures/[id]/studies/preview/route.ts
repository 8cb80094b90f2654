import { NextResponse } from "next/server";
import { captureParamsSchema } from "@/lib/api/params";
import { readJson, withAuth } from "@/lib/api/with-auth";
import { computeMitigationStudy } from "@/lib/captures/mitigation-study";
import { previewStudySchema } from "@/lib/validations/studies";

// POST /api/captures/:id/studies/preview — try a fix: the predicted spectrum and verdict, nothing saved; starts from
// the evaluation named in the body (else the sheet's default). Viewers read saved studies but run none (403).
export const POST = withAuth<{ id: string }>(
  async ({ req, params, user }) => {
    const { id } = captureParamsSchema.parse(params);
    const { evaluationId: named, ...inputs } = previewStudySchema.parse(await readJson(req));
    const { evaluationId, result } = await computeMitigationStudy({ captureId: id, reader: user, inputs, evaluationId: named });
    return NextResponse.json({ evaluationId, result });
  },
  { permission: "captures:what-if" },
);
