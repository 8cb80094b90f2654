import { NextResponse } from "next/server";
import { createInvitation, listUsers } from "@/db/queries/users";
import { readJson, withAuth } from "@/lib/api/with-auth";
import { appUrl, sendMail } from "@/lib/mail/send";
import { inviteUserSchema } from "@/lib/validations/auth";
import { roleLabels } from "@/lib/auth/permissions";

// GET /api/users — all users (admin)
export const GET = withAuth(async () => NextResponse.json({ users: await listUsers() }), { permission: "users:manage" });

// POST /api/users — invite a user by e-mail (admin)
export const POST = withAuth(
  async ({ req, user: actor }) => {
    const input = inviteUserSchema.parse(await readJson(req));
    const { user, token } = await createInvitation({ ...input, actorId: actor.id });
    const link = appUrl(`/invite/${token}`);
    await sendMail({
      to: user.email,
      subject: "Your Ordwise account",
      text: [
        `Hello ${user.name},`,
        "",
        `${actor.name} has invited you to Ordwise as ${roleLabels[user.role]}.`,
        `Set your password here (the link works once and expires in 72 hours):`,
        link,
      ].join("\n"),
    });
    return NextResponse.json({ user }, { status: 201 });
  },
  { permission: "users:manage" },
);
