import { NextResponse } from "next/server";
import { captureParamsSchema } from "@/lib/api/params";
import { readJson, withAuth } from "@/lib/api/with-auth";
import { computeMitigationStudy } from "@/lib/captures/mitigation-study";
import { previewStudySchema } from "@/lib/validations/studies";

// POST /api/captures/:id/studies/preview — try a fix: the predicted spectrum and verdict, nothing saved
export const POST = withAuth<{ id: string }>(
  async ({ req, params, user }) => {
    const { id } = captureParamsSchema.parse(params);
    const inputs = previewStudySchema.parse(await readJson(req));
    const { result } = await computeMitigationStudy({ captureId: id, reader: user, inputs });
    return NextResponse.json({ result });
  },
  { permission: "captures:read" },
);
