import { NextResponse } from "next/server";
import { listCaptures, registerCapture } from "@/db/queries/captures";
import { readJson, withAuth } from "@/lib/api/with-auth";
import { presignPut } from "@/lib/storage/s3";
import { captureListQuerySchema, registerCaptureSchema } from "@/lib/validations/capture";

// GET /api/captures — filtered, paginated list (site, verdict, status, date range)
export const GET = withAuth(
  async ({ req, user }) => {
    const query = captureListQuerySchema.parse(Object.fromEntries(req.nextUrl.searchParams));
    return NextResponse.json(await listCaptures({ query, reader: user }));
  },
  { permission: "captures:read" },
);

// POST /api/captures — register a capture and get a presigned URL to PUT the original file to
export const POST = withAuth(
  async ({ req, user }) => {
    const input = registerCaptureSchema.parse(await readJson(req));
    const capture = await registerCapture({ input, actorId: user.id });
    const uploadUrl = await presignPut(capture.s3Key, "text/csv");
    return NextResponse.json({ capture, uploadUrl, contentType: "text/csv" }, { status: 201 });
  },
  { permission: "captures:upload" },
);
