import { NextResponse } from "next/server";
import { getCaptureById, saveIntervalSetup } from "@/db/queries/captures";
import { captureParamsSchema } from "@/lib/api/params";
import { readJson, withAuth } from "@/lib/api/with-auth";
import { authoriseCaptureEdit } from "@/lib/auth/session";
import { intervalSetupSchema } from "@/lib/validations/capture";

// PUT /api/captures/:id/interval-setup — an interval log's column mapping (remembered for the site), limit set and context
export const PUT = withAuth<{ id: string }>(
  async ({ req, params, user }) => {
    const { id } = captureParamsSchema.parse(params);
    authoriseCaptureEdit(user, await getCaptureById({ id, reader: user }));
    const setup = intervalSetupSchema.parse(await readJson(req));
    return NextResponse.json({ capture: await saveIntervalSetup({ id, setup, actorId: user.id, reader: user }) });
  },
  { permission: "captures:upload" },
);
