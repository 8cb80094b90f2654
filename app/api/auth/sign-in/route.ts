import { NextResponse } from "next/server";
import { clearSignInFailures, getUserByEmail, recordSignInFailure, signInLockRemaining } from "@/db/queries/users";
import { withPublic, readJson } from "@/lib/api/with-auth";
import { verifyPassword } from "@/lib/auth/password";
import { startSession } from "@/lib/auth/session";
import { AppError } from "@/lib/errors";
import { signInSchema } from "@/lib/validations/auth";

// POST /api/auth/sign-in — start a session (throttled after repeated failures)
export const POST = withPublic(async ({ req }) => {
  const { email, password } = signInSchema.parse(await readJson(req));
  const waitMs = await signInLockRemaining({ email });
  if (waitMs > 0) {
    throw new AppError("too_many_requests", `Too many failed sign-ins. Try again in ${Math.ceil(waitMs / 60000)} minutes.`);
  }
  const user = await getUserByEmail({ email });
  const ok = user?.passwordHash && user.active ? await verifyPassword(user.passwordHash, password) : false;
  if (!user || !ok) {
    await recordSignInFailure({ email });
    throw new AppError("unauthorized", "The e-mail or password is not right, or the account is inactive.");
  }
  await clearSignInFailures({ email });
  await startSession(user.id);
  return NextResponse.json({ user: { id: user.id, email: user.email, name: user.name, role: user.role } });
});
