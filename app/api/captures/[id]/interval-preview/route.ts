import { NextResponse } from "next/server";
import { getCaptureById } from "@/db/queries/captures";
import { captureParamsSchema } from "@/lib/api/params";
import { withAuth } from "@/lib/api/with-auth";
import { previewIntervalLog } from "@/lib/captures/interval-preview";
import { AppError } from "@/lib/errors";

// GET /api/captures/:id/interval-preview — an interval log's header, first rows and suggested column mapping
export const GET = withAuth<{ id: string }>(
  async ({ params, user }) => {
    const { id } = captureParamsSchema.parse(params);
    const capture = await getCaptureById({ id, reader: user });
    if (capture.kind !== "interval-log") throw new AppError("conflict", "This capture is a waveform record, not an interval log.");
    if (capture.status === "uploading") throw new AppError("conflict", "The file has not been uploaded yet.");
    return NextResponse.json(await previewIntervalLog(capture.s3Key));
  },
  { permission: "captures:upload" },
);
