import { NextResponse } from "next/server";
import { getCaptureById } from "@/db/queries/captures";
import { captureParamsSchema } from "@/lib/api/params";
import { withAuth } from "@/lib/api/with-auth";
import { authoriseCaptureEdit } from "@/lib/auth/session";
import { confirmUpload } from "@/lib/captures/confirm-upload";
import { previewCapture } from "@/lib/captures/preview";

// POST /api/captures/:id/uploaded — confirm the upload (size, SHA-256, not binary; once only); returns the preview for the mapping form
export const POST = withAuth<{ id: string }>(
  async ({ params, user }) => {
    const { id } = captureParamsSchema.parse(params);
    const capture = await getCaptureById({ id, reader: user });
    authoriseCaptureEdit(user, capture);
    const { sizeBytes, sha256 } = await confirmUpload({ capture, actorId: user.id });
    return NextResponse.json({ ...(await previewCapture(capture.s3Key)), sizeBytes, sha256 });
  },
  { permission: "captures:upload" },
);
