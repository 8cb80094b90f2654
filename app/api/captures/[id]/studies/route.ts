import { NextResponse } from "next/server";
import { getCaptureById } from "@/db/queries/captures";
import { insertMitigationStudy, listMitigationStudies } from "@/db/queries/studies";
import { captureParamsSchema } from "@/lib/api/params";
import { can } from "@/lib/auth/permissions";
import { readJson, withAuth } from "@/lib/api/with-auth";
import { computeMitigationStudy } from "@/lib/captures/mitigation-study";
import { saveStudySchema } from "@/lib/validations/studies";

// GET /api/captures/:id/studies — the capture's saved mitigation studies, newest first
export const GET = withAuth<{ id: string }>(
  async ({ params, user }) => {
    const { id } = captureParamsSchema.parse(params);
    await getCaptureById({ id, reader: user });
    // canSave tells the sheet whether to offer the save form (the POST checks again).
    return NextResponse.json({ studies: await listMitigationStudies({ captureId: id }), canSave: can(user.role, "captures:review") });
  },
  { permission: "captures:read" },
);

// POST /api/captures/:id/studies — save a study (recomputed here from its inputs, never taken from the client)
export const POST = withAuth<{ id: string }>(
  async ({ req, params, user }) => {
    const { id } = captureParamsSchema.parse(params);
    const { title, includeInReport, inputs } = saveStudySchema.parse(await readJson(req));
    const { analysisId, evaluationId, result } = await computeMitigationStudy({ captureId: id, reader: user, inputs });
    const studyId = await insertMitigationStudy({ captureId: id, analysisId, evaluationId, title, inputs, result, includeInReport, actorId: user.id });
    return NextResponse.json({ studyId, predictedVerdict: result.compliance?.verdict ?? "none" }, { status: 201 });
  },
  { permission: "captures:review" },
);
