import { NextResponse } from "next/server";
import { getCaptureById } from "@/db/queries/captures";
import { insertMitigationStudy, listMitigationStudies } from "@/db/queries/studies";
import { captureParamsSchema } from "@/lib/api/params";
import { can, readsApprovedResultOnly } from "@/lib/auth/permissions";
import { readJson, withAuth } from "@/lib/api/with-auth";
import { computeMitigationStudy } from "@/lib/captures/mitigation-study";
import { saveStudySchema } from "@/lib/validations/studies";

// GET /api/captures/:id/studies — the capture's saved mitigation studies, newest first, each with the evaluation
// it started from; readers outside the team get only those started from the approved evaluation
export const GET = withAuth<{ id: string }>(
  async ({ params, user }) => {
    const { id } = captureParamsSchema.parse(params);
    const capture = await getCaptureById({ id, reader: user });
    const studies = await listMitigationStudies({ captureId: id, ...(readsApprovedResultOnly(user) ? { evaluationId: capture.approvedEvaluationId } : {}) });
    // canSave / canTryFix tell the sheet which forms to offer (the POST routes check again).
    return NextResponse.json({
      studies,
      approvedEvaluationId: capture.approvedEvaluationId,
      canSave: can(user.role, "captures:review"),
      canTryFix: can(user.role, "captures:what-if"),
    });
  },
  { permission: "captures:read" },
);

// POST /api/captures/:id/studies — save a study (recomputed here from its inputs, never taken from the client),
// started from the evaluation named in the body (else the sheet's default: approved, else newest)
export const POST = withAuth<{ id: string }>(
  async ({ req, params, user }) => {
    const { id } = captureParamsSchema.parse(params);
    const { title, includeInReport, inputs, evaluationId: named } = saveStudySchema.parse(await readJson(req));
    const { analysisId, evaluationId, result } = await computeMitigationStudy({ captureId: id, reader: user, inputs, evaluationId: named });
    const studyId = await insertMitigationStudy({ captureId: id, analysisId, evaluationId, title, inputs, result, includeInReport, actorId: user.id });
    return NextResponse.json({ studyId, evaluationId, predictedVerdict: result.compliance?.verdict ?? "none" }, { status: 201 });
  },
  { permission: "captures:review" },
);
