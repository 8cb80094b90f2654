import { NextResponse } from "next/server";
import { getCaptureById } from "@/db/queries/captures";
import { captureParamsSchema } from "@/lib/api/params";
import { withAuth } from "@/lib/api/with-auth";

// GET /api/captures/:id — one capture with its status and progress
export const GET = withAuth<{ id: string }>(
  async ({ params, user }) => {
    const { id } = captureParamsSchema.parse(params);
    return NextResponse.json({ capture: await getCaptureById({ id, reader: user }) });
  },
  { permission: "captures:read" },
);
