import { NextResponse } from "next/server";
import { resendInvitation } from "@/db/queries/users";
import { withAuth } from "@/lib/api/with-auth";
import { sendInvitationMail } from "@/lib/auth/invitation-mail";
import { userParamsSchema } from "@/lib/validations/auth";

// POST /api/users/:id/invitation — send a new invitation link (admin); earlier links stop working
export const POST = withAuth<{ id: string }>(
  async ({ params, user: actor }) => {
    const { id } = userParamsSchema.parse(params);
    const { user, invitation } = await resendInvitation({ id, actorId: actor.id });
    await sendInvitationMail({ user, invitation, actorName: actor.name });
    return NextResponse.json({ user });
  },
  { permission: "users:manage" },
);
