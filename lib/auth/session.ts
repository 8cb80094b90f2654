import "server-only";
import { cookies } from "next/headers";
import { cache } from "react";
import type { Session, User } from "lucia";
import { AppError } from "@/lib/errors";
import { lucia } from "./lucia";
import { can, canEditCapture, type Permission, type Reader } from "./permissions";

export type SessionUser = User;

/** Absolute session lifetime: 7 days from sign-in, however active the session is. */
export const sessionMaxAgeMs = 7 * 24 * 3600 * 1000;

/** The signed-in user of this request, or null. Refreshes the cookie when lucia extends the session. */
export const getCurrentSession = cache(async (): Promise<{ user: User; session: Session } | { user: null; session: null }> => {
  const jar = await cookies();
  const sessionId = jar.get(lucia.sessionCookieName)?.value ?? null;
  if (!sessionId) return { user: null, session: null };
  const validated = await lucia.validateSession(sessionId);
  // The sliding 12 h lifetime is capped by an absolute one: a session ends `sessionMaxAgeMs` after it began.
  const tooOld = validated.session !== null && Date.now() - new Date(validated.session.createdAt).getTime() > sessionMaxAgeMs;
  if (tooOld) await lucia.invalidateSession(validated.session.id);
  const result = tooOld ? { user: null, session: null } : validated;
  try {
    if (result.session?.fresh) {
      const c = lucia.createSessionCookie(result.session.id);
      jar.set(c.name, c.value, c.attributes);
    }
    if (!result.session) {
      const c = lucia.createBlankSessionCookie();
      jar.set(c.name, c.value, c.attributes);
    }
  } catch {
    // Server components cannot set cookies; the next route handler or action will.
  }
  if (result.user && !result.user.active) return { user: null, session: null };
  return result;
});

/**
 * The one authorisation check: signed in, active, and the role holds the permission.
 * Throws AppError("unauthorized" | "forbidden"); returns the user otherwise.
 */
export async function authorise(permission: Permission | null): Promise<User> {
  const { user } = await getCurrentSession();
  if (!user) throw new AppError("unauthorized", "Sign in to continue.");
  if (permission && !can(user.role, permission)) {
    throw new AppError("forbidden", "Your role does not allow this.");
  }
  return user;
}

/**
 * Object-level check for changing a capture (upload, set-up, analysis, submission): see canEditCapture.
 * Throws AppError("forbidden") with the reason; the caller has already checked the role's permission.
 */
export function authoriseCaptureEdit(reader: Reader, capture: Parameters<typeof canEditCapture>[1]): void {
  if (canEditCapture(reader, capture)) return;
  throw new AppError(
    "forbidden",
    reader.role === "technician" && capture.uploadedBy === reader.id
      ? "This capture has been submitted; only an engineer can change it now."
      : "Technicians change only the captures they uploaded.",
  );
}

export async function startSession(userId: string): Promise<void> {
  const session = await lucia.createSession(userId, { createdAt: new Date() });
  const c = lucia.createSessionCookie(session.id);
  (await cookies()).set(c.name, c.value, c.attributes);
}

export async function endSession(): Promise<void> {
  const { session } = await getCurrentSession();
  if (session) await lucia.invalidateSession(session.id);
  const c = lucia.createBlankSessionCookie();
  (await cookies()).set(c.name, c.value, c.attributes);
}
