import { NextResponse } from "next/server";
import { toCaptureView } from "@/db/queries/capture-view";
import { listCaptures, registerCapture } from "@/db/queries/captures";
import { readJson, withAuth } from "@/lib/api/with-auth";
import { incomingKey, uploadContentType } from "@/lib/captures/confirm-upload";
import { presignUpload } from "@/lib/storage/s3";
import { captureListQuerySchema, registerCaptureSchema } from "@/lib/validations/capture";

// GET /api/captures — filtered, paginated list (site, verdict, status, date range)
export const GET = withAuth(
  async ({ req, user }) => {
    const query = captureListQuerySchema.parse(Object.fromEntries(req.nextUrl.searchParams));
    return NextResponse.json(await listCaptures({ query, reader: user }));
  },
  { permission: "captures:read" },
);

// POST /api/captures — register a capture and get a presigned form upload (POST policy: this key, this type,
// at most the registered size, 10 minutes) for the original file
export const POST = withAuth(
  async ({ req, user }) => {
    const input = registerCaptureSchema.parse(await readJson(req));
    const capture = await registerCapture({ input, actorId: user.id });
    const upload = await presignUpload(incomingKey(capture.id), { contentType: uploadContentType, maxBytes: input.sizeBytes });
    return NextResponse.json({ capture: toCaptureView(capture), upload, contentType: uploadContentType }, { status: 201 });
  },
  { permission: "captures:upload" },
);
