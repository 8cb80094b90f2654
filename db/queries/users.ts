import "server-only";
import { sha256 } from "@oslojs/crypto/sha2";
import { encodeBase32LowerCaseNoPadding, encodeHexLowerCase } from "@oslojs/encoding";
import { and, asc, eq, gt, isNull } from "drizzle-orm";
import { generateIdFromEntropySize } from "lucia";
import { db } from "@/db/client";
import { invitations, sessions, signInAttempts, users, type User } from "@/db/schema";
import type { Role } from "@/lib/auth/permissions";
import { AppError } from "@/lib/errors";
import { insertAuditEvent } from "./audit";

const invitationLifetimeMs = 72 * 3600 * 1000;
export const throttle = { maxFailures: 5, windowMs: 15 * 60 * 1000, lockMs: 15 * 60 * 1000 };

export type PublicUser = Omit<User, "passwordHash"> & { invited: boolean };

function toPublic(u: User): PublicUser {
  const { passwordHash, ...rest } = u;
  return { ...rest, invited: passwordHash === null };
}

export function hashToken(token: string): string {
  return encodeHexLowerCase(sha256(new TextEncoder().encode(token)));
}

export async function listUsers(): Promise<PublicUser[]> {
  const rows = await db.select().from(users).orderBy(asc(users.email));
  return rows.map(toPublic);
}

export async function getUserByEmail({ email }: { email: string }): Promise<User | undefined> {
  const [u] = await db.select().from(users).where(eq(users.email, email));
  return u;
}

/** Creates the invited user (no password yet) and an invitation token; returns the token to e-mail. */
export async function createInvitation({
  email,
  name,
  role,
  actorId,
}: {
  email: string;
  name: string;
  role: Role;
  actorId: string;
}): Promise<{ user: PublicUser; token: string }> {
  return db.transaction(async (tx) => {
    const [existing] = await tx.select().from(users).where(eq(users.email, email));
    if (existing?.passwordHash) throw new AppError("conflict", `${email} already has an account.`);
    const user =
      existing ??
      (await tx.insert(users).values({ id: generateIdFromEntropySize(10), email, name, role }).returning())[0];
    if (!user) throw new AppError("internal", "The user was not saved.");
    if (existing) await tx.update(users).set({ name, role }).where(eq(users.id, existing.id));
    const token = encodeBase32LowerCaseNoPadding(crypto.getRandomValues(new Uint8Array(20)));
    await tx.insert(invitations).values({
      tokenHash: hashToken(token),
      userId: user.id,
      invitedBy: actorId,
      expiresAt: new Date(Date.now() + invitationLifetimeMs),
    });
    await insertAuditEvent(tx, { actorId, action: "user.invite", entityType: "user", entityId: user.id, details: { email, role } });
    return { user: toPublic({ ...user, name, role }), token };
  });
}

export async function findOpenInvitation({ token }: { token: string }) {
  const [row] = await db
    .select({ invitationId: invitations.id, userId: users.id, email: users.email, name: users.name })
    .from(invitations)
    .innerJoin(users, eq(users.id, invitations.userId))
    .where(and(eq(invitations.tokenHash, hashToken(token)), isNull(invitations.acceptedAt), gt(invitations.expiresAt, new Date())));
  return row ?? null;
}

export async function acceptInvitation({ token, passwordHash }: { token: string; passwordHash: string }): Promise<string> {
  const open = await findOpenInvitation({ token });
  if (!open) throw new AppError("not_found", "This invitation link is invalid, used or expired. Ask an admin for a new one.");
  await db.transaction(async (tx) => {
    await tx.update(invitations).set({ acceptedAt: new Date() }).where(eq(invitations.id, open.invitationId));
    await tx.update(users).set({ passwordHash, active: true }).where(eq(users.id, open.userId));
    await insertAuditEvent(tx, { actorId: open.userId, action: "user.accept_invitation", entityType: "user", entityId: open.userId });
  });
  return open.userId;
}

export async function updateUser({
  id,
  role,
  active,
  actorId,
}: {
  id: string;
  role?: Role;
  active?: boolean;
  actorId: string;
}): Promise<PublicUser> {
  if (id === actorId && (active === false || (role !== undefined && role !== "admin"))) {
    throw new AppError("conflict", "You cannot demote or deactivate your own account.");
  }
  return db.transaction(async (tx) => {
    const [u] = await tx
      .update(users)
      .set({ ...(role !== undefined ? { role } : {}), ...(active !== undefined ? { active } : {}) })
      .where(eq(users.id, id))
      .returning();
    if (!u) throw new AppError("not_found", "No such user.");
    // A deactivated user's sessions end at once.
    if (active === false) await tx.delete(sessions).where(eq(sessions.userId, id));
    await insertAuditEvent(tx, { actorId, action: "user.update", entityType: "user", entityId: id, details: { role, active } });
    return toPublic(u);
  });
}

/** Milliseconds the address must still wait, or 0. */
export async function signInLockRemaining({ email }: { email: string }): Promise<number> {
  const [row] = await db.select().from(signInAttempts).where(eq(signInAttempts.email, email));
  if (!row?.lockedUntil) return 0;
  return Math.max(0, row.lockedUntil.getTime() - Date.now());
}

export async function recordSignInFailure({ email }: { email: string }): Promise<void> {
  const now = Date.now();
  const [row] = await db.select().from(signInAttempts).where(eq(signInAttempts.email, email));
  if (!row || now - row.windowStart.getTime() > throttle.windowMs) {
    if (row) await db.delete(signInAttempts).where(eq(signInAttempts.id, row.id));
    await db.insert(signInAttempts).values({ email, failures: 1, windowStart: new Date(now) });
    return;
  }
  const failures = row.failures + 1;
  await db
    .update(signInAttempts)
    .set({ failures, lockedUntil: failures >= throttle.maxFailures ? new Date(now + throttle.lockMs) : null })
    .where(eq(signInAttempts.id, row.id));
}

export async function clearSignInFailures({ email }: { email: string }): Promise<void> {
  await db.delete(signInAttempts).where(eq(signInAttempts.email, email));
}
