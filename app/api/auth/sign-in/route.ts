import { NextResponse } from "next/server";
import { claimSignInAttempt, getUserByEmail, releaseSignInAttempt } from "@/db/queries/users";
import { clientAddress, readJson, withPublic } from "@/lib/api/with-auth";
import { verifyPassword } from "@/lib/auth/password";
import { startSession } from "@/lib/auth/session";
import { AppError } from "@/lib/errors";
import { signInSchema } from "@/lib/validations/auth";

function waitWords(s: number): string {
  return s < 120 ? `${s} second${s === 1 ? "" : "s"}` : `${Math.ceil(s / 60)} minutes`;
}

// POST /api/auth/sign-in — start a session (each attempt is claimed against per-account back-off and a per-client limit)
export const POST = withPublic(async ({ req }) => {
  const { email, password } = signInSchema.parse(await readJson(req, { maxBytes: 4 * 1024 }));
  const client = clientAddress(req);
  const claim = await claimSignInAttempt({ email, client });
  if (!claim.ok) {
    const from = claim.scope === "client" ? " from this address" : "";
    throw new AppError("too_many_requests", `Too many failed sign-ins${from}. Try again in ${waitWords(claim.waitS)}.`, undefined, claim.waitS);
  }
  const user = await getUserByEmail({ email });
  const ok = user?.passwordHash && user.active ? await verifyPassword(user.passwordHash, password) : false;
  if (!user || !ok) throw new AppError("unauthorized", "The e-mail or password is not right, or the account is inactive.");
  await releaseSignInAttempt({ email, client });
  await startSession(user.id);
  return NextResponse.json({ user: { id: user.id, email: user.email, name: user.name, role: user.role } });
});
