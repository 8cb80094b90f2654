import { NextResponse } from "next/server";
import { getCaptureById, saveCaptureSetup } from "@/db/queries/captures";
import { captureParamsSchema } from "@/lib/api/params";
import { readJson, withAuth } from "@/lib/api/with-auth";
import { authoriseCaptureEdit } from "@/lib/auth/session";
import { captureSetupSchema } from "@/lib/validations/capture";

// PUT /api/captures/:id/setup — channel mapping, limit set and evaluation context
export const PUT = withAuth<{ id: string }>(
  async ({ req, params, user }) => {
    const { id } = captureParamsSchema.parse(params);
    authoriseCaptureEdit(user, await getCaptureById({ id, reader: user }));
    const setup = captureSetupSchema.parse(await readJson(req));
    return NextResponse.json({ capture: await saveCaptureSetup({ id, setup, actorId: user.id, reader: user }) });
  },
  { permission: "captures:upload" },
);
