import { NextResponse } from "next/server";
import { getCaptureById, setCaptureStatus, startAnalysis } from "@/db/queries/captures";
import { captureParamsSchema } from "@/lib/api/params";
import { withAuth } from "@/lib/api/with-auth";
import { authoriseCaptureEdit } from "@/lib/auth/session";
import { enqueueAnalysis } from "@/lib/jobs/queue";

// POST /api/captures/:id/analyze — put the analysis on the job queue; status and progress are read from GET /api/captures/:id
export const POST = withAuth<{ id: string }>(
  async ({ params, user }) => {
    const { id } = captureParamsSchema.parse(params);
    // Technicians start only their own captures, until submitted; the conditional update then decides
    // who queues the job: parallel requests queue one, the others get 409.
    authoriseCaptureEdit(user, await getCaptureById({ id, reader: user }));
    await startAnalysis({ id, reader: user });
    try {
      const jobId = await enqueueAnalysis({ captureId: id, actorId: user.id });
      return NextResponse.json({ status: "queued", jobId }, { status: 202 });
    } catch (err) {
      await setCaptureStatus({ id, status: "failed", failureReason: "The analysis could not be queued; try again." });
      throw err;
    }
  },
  { permission: "captures:upload" },
);
