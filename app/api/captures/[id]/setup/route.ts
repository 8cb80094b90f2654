import { NextResponse } from "next/server";
import { saveCaptureSetup } from "@/db/queries/captures";
import { editableCaptureId } from "@/lib/api/editable-capture-id";
import { readJson, withAuth } from "@/lib/api/with-auth";
import { captureSetupSchema } from "@/lib/validations/capture";

// PUT /api/captures/:id/setup — channel mapping, limit set and evaluation context
export const PUT = withAuth<{ id: string }>(
  async ({ req, params, user }) => {
    const id = await editableCaptureId(params, user);
    const setup = captureSetupSchema.parse(await readJson(req));
    return NextResponse.json({ capture: await saveCaptureSetup({ id, setup, actorId: user.id, reader: user }) });
  },
  { permission: "captures:upload" },
);
