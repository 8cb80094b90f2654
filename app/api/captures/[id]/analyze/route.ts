import { NextResponse } from "next/server";
import { getCaptureById, setCaptureStatus } from "@/db/queries/captures";
import { captureParamsSchema } from "@/lib/api/params";
import { withAuth } from "@/lib/api/with-auth";
import { authoriseCaptureEdit } from "@/lib/auth/session";
import { enqueueAnalysis } from "@/lib/jobs/queue";
import { AppError } from "@/lib/errors";

// POST /api/captures/:id/analyze — put the analysis on the job queue; status and progress are read from GET /api/captures/:id
export const POST = withAuth<{ id: string }>(
  async ({ params, user }) => {
    const { id } = captureParamsSchema.parse(params);
    const capture = await getCaptureById({ id, reader: user });
    authoriseCaptureEdit(user, capture);
    if (capture.status === "uploading") throw new AppError("conflict", "The file has not been uploaded yet.");
    if (capture.status === "queued" || capture.status === "running") throw new AppError("conflict", "The analysis is already running.");
    if (!capture.limitSetKey) throw new AppError("conflict", "Save the mapping and choose a limit set first.");
    await setCaptureStatus({ id, status: "queued", progressPercent: 0, failureReason: null });
    const jobId = await enqueueAnalysis({ captureId: id, actorId: user.id });
    return NextResponse.json({ status: "queued", jobId }, { status: 202 });
  },
  { permission: "captures:upload" },
);
