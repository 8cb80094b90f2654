import { NextResponse } from "next/server";
import { getCaptureById, getCurrentRevision, insertEvaluation, latestAnalysis, listEvaluations } from "@/db/queries/captures";
import { captureParamsSchema } from "@/lib/api/params";
import { readJson, withAuth } from "@/lib/api/with-auth";
import { AppError } from "@/lib/errors";
import { evaluateCapture } from "@/lib/pipeline/run-capture";
import { reevaluateSchema } from "@/lib/validations/capture";

// GET /api/captures/:id/evaluations — every evaluation of the capture, newest first
export const GET = withAuth<{ id: string }>(
  async ({ params, user }) => {
    const { id } = captureParamsSchema.parse(params);
    await getCaptureById({ id, reader: user });
    return NextResponse.json({ evaluations: await listEvaluations({ captureId: id }) });
  },
  { permission: "captures:read" },
);

// POST /api/captures/:id/evaluations — judge the latest analysis again in a new context or against another set
export const POST = withAuth<{ id: string }>(
  async ({ req, params, user }) => {
    const { id } = captureParamsSchema.parse(params);
    const { limitSetKey, context } = reevaluateSchema.parse(await readJson(req));
    await getCaptureById({ id, reader: user });
    const analysis = await latestAnalysis({ captureId: id });
    if (!analysis) throw new AppError("conflict", "The capture has not been analysed yet.");
    const revision = await getCurrentRevision({ key: limitSetKey });
    const result = evaluateCapture(analysis.result, revision, context);
    const evaluationId = await insertEvaluation({ captureId: id, analysisId: analysis.id, revisionId: revision.revisionId, context, result, actorId: user.id });
    return NextResponse.json({ evaluationId, verdict: result.verdict }, { status: 201 });
  },
  { permission: "captures:review" },
);
