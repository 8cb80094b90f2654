import { NextResponse } from "next/server";
import { captureParamsSchema } from "@/lib/api/params";
import { withAuth } from "@/lib/api/with-auth";
import { diagnoseCapture } from "@/lib/captures/mitigation-study";

// GET /api/captures/:id/diagnosis — which converter front end each current channel resembles (top three)
export const GET = withAuth<{ id: string }>(
  async ({ params, user }) => {
    const { id } = captureParamsSchema.parse(params);
    return NextResponse.json({ diagnosis: await diagnoseCapture({ captureId: id, reader: user }) });
  },
  { permission: "captures:read" },
);
