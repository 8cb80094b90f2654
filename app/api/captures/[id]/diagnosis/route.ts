import { NextResponse } from "next/server";
import { captureParamsSchema } from "@/lib/api/params";
import { withAuth } from "@/lib/api/with-auth";
import { diagnoseCapture } from "@/lib/captures/mitigation-study";
import { reportQuery } from "@/lib/reports/responses";

// GET /api/captures/:id/diagnosis — which converter front end each current channel resembles (top three), in the
// analysis behind ?evaluation=ID (else the sheet's default; viewers always the approved one)
export const GET = withAuth<{ id: string }>(
  async ({ req, params, user }) => {
    const { id } = captureParamsSchema.parse(params);
    const { evaluation } = reportQuery(req.url);
    return NextResponse.json({ diagnosis: await diagnoseCapture({ captureId: id, reader: user, evaluationId: evaluation }) });
  },
  { permission: "captures:read" },
);
