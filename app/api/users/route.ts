import { NextResponse } from "next/server";
import { createInvitation, listUsers } from "@/db/queries/users";
import { readJson, withAuth } from "@/lib/api/with-auth";
import { sendInvitationMail } from "@/lib/auth/invitation-mail";
import { inviteUserSchema } from "@/lib/validations/auth";

// GET /api/users — all users (admin)
export const GET = withAuth(async () => NextResponse.json({ users: await listUsers() }), { permission: "users:manage" });

// POST /api/users — invite a user by e-mail (admin); inviting again cancels the earlier link
export const POST = withAuth(
  async ({ req, user: actor }) => {
    const input = inviteUserSchema.parse(await readJson(req, { maxBytes: 8 * 1024 }));
    const { user, invitation } = await createInvitation({ ...input, actorId: actor.id });
    await sendInvitationMail({ user, invitation, actorName: actor.name });
    return NextResponse.json({ user }, { status: 201 });
  },
  { permission: "users:manage" },
);
