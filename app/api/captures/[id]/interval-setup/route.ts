import { NextResponse } from "next/server";
import { saveIntervalSetup } from "@/db/queries/captures";
import { editableCaptureId } from "@/lib/api/editable-capture-id";
import { readJson, withAuth } from "@/lib/api/with-auth";
import { intervalSetupSchema } from "@/lib/validations/capture";

// PUT /api/captures/:id/interval-setup — an interval log's column mapping (remembered for the site), limit set and context
export const PUT = withAuth<{ id: string }>(
  async ({ req, params, user }) => {
    const id = await editableCaptureId(params, user);
    const setup = intervalSetupSchema.parse(await readJson(req));
    return NextResponse.json({ capture: await saveIntervalSetup({ id, setup, actorId: user.id, reader: user }) });
  },
  { permission: "captures:upload" },
);
