import { NextResponse } from "next/server";
import { acceptInvitation } from "@/db/queries/users";
import { readJson, withPublic } from "@/lib/api/with-auth";
import { hashPassword } from "@/lib/auth/password";
import { startSession } from "@/lib/auth/session";
import { acceptInvitationSchema } from "@/lib/validations/auth";

// POST /api/invitations/accept — the invitee sets a password and is signed in (their other sessions end)
export const POST = withPublic(async ({ req }) => {
  const { token, password } = acceptInvitationSchema.parse(await readJson(req, { maxBytes: 4 * 1024 }));
  const userId = await acceptInvitation({ token, passwordHash: await hashPassword(password) });
  await startSession(userId);
  return NextResponse.json({ ok: true });
});
