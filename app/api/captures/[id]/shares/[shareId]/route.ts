import { NextResponse } from "next/server";
import { revokeShareLink } from "@/db/queries/captures";
import { shareParamsSchema } from "@/lib/api/params";
import { withAuth } from "@/lib/api/with-auth";

// DELETE /api/captures/:id/shares/:shareId — revoke a share link at once
export const DELETE = withAuth<{ id: string; shareId: string }>(
  async ({ params, user }) => {
    const { id, shareId } = shareParamsSchema.parse(params);
    await revokeShareLink({ captureId: id, shareId, actorId: user.id });
    return NextResponse.json({ ok: true });
  },
  { permission: "captures:share" },
);
