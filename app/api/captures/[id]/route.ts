import { NextResponse } from "next/server";
import { toCaptureView } from "@/db/queries/capture-view";
import { switchCaptureKind, withdrawCapture } from "@/db/queries/captures";
import { getCaptureStatus } from "@/db/queries/sheet";
import { captureParamsSchema } from "@/lib/api/params";
import { readJson, withAuth } from "@/lib/api/with-auth";
import { switchKindSchema } from "@/lib/validations/capture";

// GET /api/captures/:id — one capture's identity, status and progress (what the progress view polls; not its set-up)
export const GET = withAuth<{ id: string }>(
  async ({ params, user }) => {
    const { id } = captureParamsSchema.parse(params);
    return NextResponse.json({ capture: await getCaptureStatus({ id, reader: user }) });
  },
  { permission: "captures:read" },
);

// PATCH /api/captures/:id — switch the upload kind (waveform record / interval log) before analysis
export const PATCH = withAuth<{ id: string }>(
  async ({ req, params, user }) => {
    const { id } = captureParamsSchema.parse(params);
    const { kind } = switchKindSchema.parse(await readJson(req));
    return NextResponse.json({ capture: toCaptureView(await switchCaptureKind({ id, kind, actorId: user.id, reader: user })) });
  },
  { permission: "captures:upload" },
);

// DELETE /api/captures/:id — the uploader withdraws a capture before submission (hidden, kept in the audit log)
export const DELETE = withAuth<{ id: string }>(
  async ({ params, user }) => {
    const { id } = captureParamsSchema.parse(params);
    await withdrawCapture({ id, actorId: user.id, reader: user });
    return NextResponse.json({ withdrawn: true });
  },
  { permission: "captures:upload" },
);
