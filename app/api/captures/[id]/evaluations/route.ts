import { NextResponse } from "next/server";
import { getCaptureById, getCurrentRevision, insertEvaluation, latestAnalysis, listEvaluations } from "@/db/queries/captures";
import { captureParamsSchema } from "@/lib/api/params";
import { readJson, withAuth } from "@/lib/api/with-auth";
import { readsApprovedResultOnly } from "@/lib/auth/permissions";
import { AppError } from "@/lib/errors";
import { evaluateStoredIntervalLog } from "@/lib/captures/evaluate-stored-interval-log";
import { IntervalLogError } from "@/lib/intervals/errors";
import { OriginalChangedError } from "@/lib/captures/original-changed-error";
import { runCaptureEvaluation } from "@/lib/pipeline/run-capture-evaluation";
import { reevaluateSchema } from "@/lib/validations/capture";

/** A log that no longer imports with its stored mapping (e.g. the mapping was changed) cannot be judged again as analysed. */
function rethrowAsConflict(err: unknown): never {
  if (err instanceof IntervalLogError) throw new AppError("conflict", `The interval log cannot be judged again with its saved mapping: ${err.message}`);
  if (err instanceof OriginalChangedError) throw new AppError("conflict", err.message);
  throw err;
}

// GET /api/captures/:id/evaluations — every evaluation of the capture, newest first; readers outside the team get
// only the approved one
export const GET = withAuth<{ id: string }>(
  async ({ params, user }) => {
    const { id } = captureParamsSchema.parse(params);
    const capture = await getCaptureById({ id, reader: user });
    const only = readsApprovedResultOnly(user) ? { onlyId: capture.approvedEvaluationId } : {};
    return NextResponse.json({ evaluations: await listEvaluations({ captureId: id, ...only }) });
  },
  { permission: "captures:read" },
);

// POST /api/captures/:id/evaluations — judge the latest analysis again in a new context or against another set
export const POST = withAuth<{ id: string }>(
  async ({ req, params, user }) => {
    const { id } = captureParamsSchema.parse(params);
    const { limitSetKey, context } = reevaluateSchema.parse(await readJson(req));
    const capture = await getCaptureById({ id, reader: user });
    const analysis = await latestAnalysis({ captureId: id });
    if (!analysis) throw new AppError("conflict", "The capture has not been analysed yet.");
    const revision = await getCurrentRevision({ key: limitSetKey });
    // An interval log's stored analysis has no channels: it is judged again from its logged series.
    const result =
      capture.kind === "interval-log"
        ? (await evaluateStoredIntervalLog(capture, revision, context).catch(rethrowAsConflict)).result
        : runCaptureEvaluation(analysis.result, revision, context, capture.capturedAt?.getTime());
    const evaluationId = await insertEvaluation({ captureId: id, analysisId: analysis.id, revisionId: revision.revisionId, context, result, actorId: user.id });
    return NextResponse.json({ evaluationId, verdict: result.verdict }, { status: 201 });
  },
  { permission: "captures:review" },
);
