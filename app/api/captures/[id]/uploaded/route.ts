import { NextResponse } from "next/server";
import { getCaptureById, setCaptureStatus } from "@/db/queries/captures";
import { captureParamsSchema } from "@/lib/api/params";
import { withAuth } from "@/lib/api/with-auth";
import { authoriseCaptureEdit } from "@/lib/auth/session";
import { previewCapture } from "@/lib/captures/preview";
import { AppError } from "@/lib/errors";
import { headObject } from "@/lib/storage/s3";

// POST /api/captures/:id/uploaded — confirm the upload reached the bucket; returns the preview for the mapping form
export const POST = withAuth<{ id: string }>(
  async ({ params, user }) => {
    const { id } = captureParamsSchema.parse(params);
    const capture = await getCaptureById({ id, reader: user });
    authoriseCaptureEdit(user, capture);
    const head = await headObject(capture.s3Key);
    if (!head) throw new AppError("conflict", "The file has not arrived in storage. Upload it again.");
    if (head.sizeBytes === 0) throw new AppError("validation", "The uploaded file is empty.");
    if (capture.status === "uploading") await setCaptureStatus({ id, status: "uploaded", sizeBytes: head.sizeBytes });
    return NextResponse.json({ ...(await previewCapture(capture.s3Key)), sizeBytes: head.sizeBytes });
  },
  { permission: "captures:upload" },
);
