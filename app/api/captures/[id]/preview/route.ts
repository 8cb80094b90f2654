import { NextResponse } from "next/server";
import { getCaptureById } from "@/db/queries/captures";
import { captureParamsSchema } from "@/lib/api/params";
import { withAuth } from "@/lib/api/with-auth";
import { previewCapture } from "@/lib/captures/preview";
import { AppError } from "@/lib/errors";

// GET /api/captures/:id/preview — first lines of the original and the detected layout and channels
export const GET = withAuth<{ id: string }>(
  async ({ params, user }) => {
    const { id } = captureParamsSchema.parse(params);
    const capture = await getCaptureById({ id, reader: user });
    if (capture.status === "uploading") throw new AppError("conflict", "The file has not been uploaded yet.");
    return NextResponse.json(await previewCapture(capture.s3Key));
  },
  { permission: "captures:upload" },
);
