import "server-only";
import { sha256 } from "@oslojs/crypto/sha2";
import { encodeBase32LowerCaseNoPadding, encodeHexLowerCase } from "@oslojs/encoding";
import { and, asc, eq, gt, isNull, sql } from "drizzle-orm";
import { generateIdFromEntropySize } from "lucia";
import { db, type Tx } from "@/db/client";
import { invitations, sessions, signInThrottle, users, type User } from "@/db/schema";
import type { Role } from "@/lib/auth/permissions";
import { AppError } from "@/lib/errors";
import { insertAuditEvent } from "./audit";

const invitationLifetimeMs = 72 * 3600 * 1000;
/**
 * Sign-in throttling. Per account: the first `freeAttempts` attempts go through at once; after the n-th
 * (n ≥ freeAttempts) the next waits 2^(n − freeAttempts + 1) s (2, 4, 8 … s, at most `maxDelayS`), so an attacker
 * cannot lock the real user out for long; an hour without attempts starts afresh. Per client address:
 * at most `clientMaxFailures` failed attempts across all accounts in `clientWindowS`.
 */
export const throttle = { freeAttempts: 5, maxDelayS: 300, quietResetS: 3600, clientMaxFailures: 30, clientWindowS: 900 } as const;

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

/** A token to e-mail and when it stops working, as stored. */
export interface IssuedInvitation {
  token: string;
  expiresAt: Date;
}

/** Writes a new invitation for `userId`, cancelling (deleting) every earlier token of that user; returns the token to e-mail and its stored expiry. */
async function issueInvitation(tx: Tx, { userId, actorId }: { userId: string; actorId: string }): Promise<IssuedInvitation> {
  await tx.delete(invitations).where(eq(invitations.userId, userId));
  const token = encodeBase32LowerCaseNoPadding(crypto.getRandomValues(new Uint8Array(20)));
  const [stored] = await tx
    .insert(invitations)
    .values({
      tokenHash: hashToken(token),
      userId,
      invitedBy: actorId,
      expiresAt: new Date(Date.now() + invitationLifetimeMs),
    })
    .returning({ expiresAt: invitations.expiresAt });
  return { token, expiresAt: stored!.expiresAt };
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
}): Promise<{ user: PublicUser; invitation: IssuedInvitation }> {
  return db.transaction(async (tx) => {
    const [existing] = await tx.select().from(users).where(eq(users.email, email)).for("update");
    if (existing?.passwordHash) throw new AppError("conflict", `${email} already has an account.`);
    if (existing && !existing.active) throw new AppError("conflict", `${email} is deactivated. Reactivate the account first.`);
    const user =
      existing ??
      (await tx.insert(users).values({ id: generateIdFromEntropySize(10), email, name, role }).returning())[0];
    if (!user) throw new AppError("internal", "The user was not saved.");
    if (existing) await tx.update(users).set({ name, role }).where(eq(users.id, existing.id));
    const invitation = await issueInvitation(tx, { userId: user.id, actorId });
    await insertAuditEvent(tx, { actorId, action: "user.invite", entityType: "user", entityId: user.id, details: { email, role } });
    return { user: toPublic({ ...user, name, role }), invitation };
  });
}

/** A fresh invitation for an active user who has not set a password yet; earlier links stop working. */
export async function resendInvitation({ id, actorId }: { id: string; actorId: string }): Promise<{ user: PublicUser; invitation: IssuedInvitation }> {
  return db.transaction(async (tx) => {
    const [user] = await tx.select().from(users).where(eq(users.id, id)).for("update");
    if (!user) throw new AppError("not_found", "No such user.");
    if (user.passwordHash) throw new AppError("conflict", `${user.email} has already set a password.`);
    if (!user.active) throw new AppError("conflict", `${user.email} is deactivated. Reactivate the account first.`);
    const invitation = await issueInvitation(tx, { userId: user.id, actorId });
    await insertAuditEvent(tx, { actorId, action: "user.resend_invitation", entityType: "user", entityId: user.id });
    return { user: toPublic(user), invitation };
  });
}

/** An invitation that can still be accepted: unused, unexpired, for an active account without a password. */
export async function findOpenInvitation({ token }: { token: string }) {
  const [row] = await db
    .select({ invitationId: invitations.id, userId: users.id, email: users.email, name: users.name, expiresAt: invitations.expiresAt })
    .from(invitations)
    .innerJoin(users, eq(users.id, invitations.userId))
    .where(
      and(
        eq(invitations.tokenHash, hashToken(token)),
        isNull(invitations.acceptedAt),
        gt(invitations.expiresAt, new Date()),
        eq(users.active, true),
        isNull(users.passwordHash),
      ),
    );
  return row ?? null;
}

/**
 * Sets the invitee's password. One conditional UPDATE does it only while the token is open and the account
 * is active and has no password; the token is then used up, the user's other invitations cancelled and any
 * other session of the user ended. Never changes `active`.
 */
export async function acceptInvitation({ token, passwordHash }: { token: string; passwordHash: string }): Promise<string> {
  const tokenHash = hashToken(token);
  return db.transaction(async (tx) => {
    const [set] = await tx
      .update(users)
      .set({ passwordHash })
      .where(
        and(
          isNull(users.passwordHash),
          eq(users.active, true),
          sql`${users.id} = (select ${invitations.userId} from ${invitations}
            where ${invitations.tokenHash} = ${tokenHash} and ${invitations.acceptedAt} is null and ${invitations.expiresAt} > now())`,
        ),
      )
      .returning({ id: users.id });
    if (!set) throw new AppError("not_found", "This invitation link is invalid, used or expired. Ask an admin for a new one.");
    await tx.update(invitations).set({ acceptedAt: new Date() }).where(eq(invitations.tokenHash, tokenHash));
    await tx.delete(invitations).where(and(eq(invitations.userId, set.id), isNull(invitations.acceptedAt)));
    await tx.delete(sessions).where(eq(sessions.userId, set.id));
    await insertAuditEvent(tx, { actorId: set.id, action: "user.accept_invitation", entityType: "user", entityId: set.id });
    return set.id;
  });
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
    // A deactivated user's sessions end at once and their open invitation links stop working.
    if (active === false) {
      await tx.delete(sessions).where(eq(sessions.userId, id));
      await tx.delete(invitations).where(and(eq(invitations.userId, id), isNull(invitations.acceptedAt)));
    }
    await insertAuditEvent(tx, { actorId, action: "user.update", entityType: "user", entityId: id, details: { role, active } });
    return toPublic(u);
  });
}

export type SignInClaim = { ok: true } | { ok: false; scope: "account" | "client"; waitS: number };

/**
 * Claims one sign-in attempt for `email` from `client` before the password is checked. Each key is
 * claimed by one atomic upsert on its unique key, so parallel attempts are counted one by one.
 */
export async function claimSignInAttempt({ email, client }: { email: string; client: string }): Promise<SignInClaim> {
  const accountKey = `account:${email}`;
  // Now and then, forget keys idle for a day (guesses at made-up addresses would otherwise pile up).
  if (Math.random() < 0.02) {
    await db
      .delete(signInThrottle)
      .where(sql`${signInThrottle.nextAttemptAt} < now() - interval '1 day' and ${signInThrottle.windowStart} < now() - interval '1 day'`);
  }
  const claim = encodeHexLowerCase(crypto.getRandomValues(new Uint8Array(12)));
  const { freeAttempts, maxDelayS, quietResetS, clientMaxFailures, clientWindowS } = throttle;
  const t = signInThrottle;
  // n = this attempt's number; the next attempt waits 2^(n − free + 1) s once n ≥ free (capped).
  const n = sql`(case when ${t.nextAttemptAt} < now() - make_interval(secs => ${quietResetS}) then 1 else ${t.attempts} + 1 end)`;
  const delay = (count: ReturnType<typeof sql>) =>
    sql`make_interval(secs => case when ${count} >= ${freeAttempts} then least(${maxDelayS}, power(2, least(${count} - ${freeAttempts} + 1, 20))) else 0 end)`;
  const allowed = sql`(${t.nextAttemptAt} <= now())`;
  const [account] = await db
    .insert(t)
    .values({ key: accountKey, attempts: 1, claim, nextAttemptAt: sql`now() + ${delay(sql`1`)}` })
    .onConflictDoUpdate({
      target: t.key,
      set: {
        attempts: sql`case when ${allowed} then ${n} else ${t.attempts} end`,
        nextAttemptAt: sql`case when ${allowed} then now() + ${delay(n)} else ${t.nextAttemptAt} end`,
        claim: sql`case when ${allowed} then ${claim} else ${t.claim} end`,
      },
    })
    .returning({ claimed: sql<boolean>`${t.claim} = ${claim}`, waitS: sql<number>`ceil(extract(epoch from ${t.nextAttemptAt} - now()))::int` });
  if (!account?.claimed) return { ok: false, scope: "account", waitS: Math.max(1, account?.waitS ?? 1) };

  const expired = sql`(${t.windowStart} < now() - make_interval(secs => ${clientWindowS}))`;
  const fits = sql`(${expired} or ${t.attempts} < ${clientMaxFailures})`;
  const [byClient] = await db
    .insert(t)
    .values({ key: `client:${client}`, attempts: 1, claim })
    .onConflictDoUpdate({
      target: t.key,
      set: {
        attempts: sql`case when ${expired} then 1 when ${fits} then ${t.attempts} + 1 else ${t.attempts} end`,
        windowStart: sql`case when ${expired} then now() else ${t.windowStart} end`,
        claim: sql`case when ${fits} then ${claim} else ${t.claim} end`,
      },
    })
    .returning({
      claimed: sql<boolean>`${t.claim} = ${claim}`,
      waitS: sql<number>`ceil(extract(epoch from ${t.windowStart} + make_interval(secs => ${clientWindowS}) - now()))::int`,
    });
  if (!byClient?.claimed) return { ok: false, scope: "client", waitS: Math.max(1, byClient?.waitS ?? 1) };
  return { ok: true };
}

/** A successful sign-in: the account starts afresh and the attempt no longer counts against the client. */
export async function releaseSignInAttempt({ email, client }: { email: string; client: string }): Promise<void> {
  await db.delete(signInThrottle).where(eq(signInThrottle.key, `account:${email}`));
  await db
    .update(signInThrottle)
    .set({ attempts: sql`greatest(0, ${signInThrottle.attempts} - 1)` })
    .where(eq(signInThrottle.key, `client:${client}`));
}
