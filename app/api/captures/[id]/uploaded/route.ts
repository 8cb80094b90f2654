import { NextResponse } from "next/server";
import { getCaptureById, setCaptureStatus } from "@/db/queries/captures";
import { inspectCsv } from "@/lib/analysis/inspect-csv";
import { isAnalysisInputError } from "@/lib/analysis/errors";
import { captureParamsSchema } from "@/lib/api/params";
import { withAuth } from "@/lib/api/with-auth";
import { completeLines, decodeText } from "@/lib/captures/decode-text";
import { AppError } from "@/lib/errors";
import { getObjectHead, headObject } from "@/lib/storage/s3";

const previewBytes = 256 * 1024;

// POST /api/captures/:id/uploaded — confirm the upload reached the bucket; returns the preview for the mapping form
export const POST = withAuth<{ id: string }>(
  async ({ params, user }) => {
    const { id } = captureParamsSchema.parse(params);
    const capture = await getCaptureById({ id, role: user.role });
    const head = await headObject(capture.s3Key);
    if (!head) throw new AppError("conflict", "The file has not arrived in storage. Upload it again.");
    if (capture.status === "uploading") await setCaptureStatus({ id, status: "uploaded", sizeBytes: head.sizeBytes });
    const text = completeLines(decodeText(await getObjectHead(capture.s3Key, previewBytes)));
    const firstLines = text.split(/\r?\n/).slice(0, 12);
    try {
      return NextResponse.json({ preview: inspectCsv(text), firstLines, sizeBytes: head.sizeBytes });
    } catch (err) {
      // A file the importer cannot read still gets a preview of its lines and the reason.
      if (isAnalysisInputError(err)) return NextResponse.json({ preview: null, problem: err.message, firstLines, sizeBytes: head.sizeBytes });
      throw err;
    }
  },
  { permission: "captures:upload" },
);
