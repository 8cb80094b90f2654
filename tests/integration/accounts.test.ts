// Account attacks (issue 10 §3), each performed against the running app, its PostgreSQL and mail catcher.
import { eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { invitations, sessions, users } from "@/db/schema";
import { caughtMail, Client, signedIn } from "../support/http";
import { pollFor } from "../support/poll";

const admin = () => signedIn("admin");
const unique = (what: string) => `${what}-${Date.now()}-${Math.floor(Math.random() * 1e6)}@ordwise.test`;
/** A made-up client address (documentation range, RFC 5737) so per-client counting stays within one test. */
const fakeClient = () => `192.0.2.${1 + Math.floor(Math.random() * 250)}-${Date.now() % 100000}`;

/** Waits until `count` messages to `to` have arrived; returns their invitation tokens, newest first. */
async function inviteTokens(to: string, count: number, timeoutMs = 10_000): Promise<string[]> {
  const list = await pollFor(`${count} e-mails to ${to}`, async () => {
    const mails = await caughtMail(to);
    return mails.length >= count ? mails : null;
  }, { timeoutMs });
  return list.map((m) => /\/invite\/([a-z0-9]+)/.exec(m.text)![1]!);
}

async function invite(adminClient: Client, email: string, role = "viewer"): Promise<string> {
  const res = await adminClient.request("POST", "/api/users", { email, name: "Probe Person", role });
  expect(res.status).toBe(201);
  return ((await res.json()) as { user: { id: string } }).user.id;
}

const accept = (token: string, password: string, client = new Client()) =>
  client.request("POST", "/api/invitations/accept", { token, password, confirm: password });

async function userRow(email: string) {
  const [row] = await db.select().from(users).where(eq(users.email, email));
  return row!;
}

describe("the invitation e-mail says when its link expires", () => {
  it("gives the stored expiry as YYYY-MM-DD HH:MM UTC, in the mail and on the link's page; a resent link's mail its own", async () => {
    const a = await admin();
    const email = unique("expiry-invitee");
    const id = await invite(a, email);
    const [token] = await inviteTokens(email, 1);
    const [stored] = await db.select({ expiresAt: invitations.expiresAt }).from(invitations).where(eq(invitations.userId, id));
    // The stored expiry written out here (not through the product's formatter): ISO date and minutes, UTC.
    const when = `${stored!.expiresAt.toISOString().slice(0, 10)} ${stored!.expiresAt.toISOString().slice(11, 16)} UTC`;
    const [mail] = await caughtMail(email);
    expect(mail!.text).toContain(`expires on ${when}:`);
    // 72 hours from now, give or take the time the request took (common practice, no source: a three-day link).
    expect(Math.abs(stored!.expiresAt.getTime() - Date.now() - 72 * 3600_000)).toBeLessThan(5 * 60_000);
    const page = await (await new Client().request("GET", `/invite/${token}`)).text();
    expect(page).toContain(`This link expires on ${when}.`);

    // The dev mailbox lists the mail with its arrival time in the same form.
    const mailbox = (await (await a.request("GET", "/dev/mailbox")).text()).replaceAll("<!-- -->", "");
    expect(mailbox).toMatch(new RegExp(`to ${email.replace(/[.+]/g, "\\$&")} · \\d{4}-\\d{2}-\\d{2} \\d{2}:\\d{2} UTC`));

    // A resent link's mail says its own stored expiry.
    expect((await a.request("POST", `/api/users/${id}/invitation`)).status).toBe(200);
    await inviteTokens(email, 2);
    const [renewed] = await db.select({ expiresAt: invitations.expiresAt }).from(invitations).where(eq(invitations.userId, id));
    const renewedWhen = `${renewed!.expiresAt.toISOString().slice(0, 10)} ${renewed!.expiresAt.toISOString().slice(11, 16)} UTC`;
    expect((await caughtMail(email))[0]!.text).toContain(`expires on ${renewedWhen}:`);
  });
});

describe("invitations cannot be replayed or revive an account", () => {
  it("deactivating an invited user cancels their link; it can neither set a password nor re-activate the account", async () => {
    const a = await admin();
    const email = unique("deactivated-invitee");
    const id = await invite(a, email);
    const [token] = await inviteTokens(email, 1);
    expect((await a.request("PATCH", `/api/users/${id}`, { active: false })).status).toBe(200);

    expect((await accept(token!, "a secret long enough")).status).toBe(404);
    const row = await userRow(email);
    expect(row.active).toBe(false);
    expect(row.passwordHash).toBeNull();

    // Reactivating does not bring the old link back; an admin resends a fresh one.
    expect((await a.request("PATCH", `/api/users/${id}`, { active: true })).status).toBe(200);
    expect((await accept(token!, "a secret long enough")).status).toBe(404);
    expect((await a.request("POST", `/api/users/${id}/invitation`)).status).toBe(200);
    const [fresh] = await inviteTokens(email, 2);
    expect(fresh).not.toBe(token);
    expect((await accept(fresh!, "a secret long enough")).status).toBe(200);
  });

  it("inviting again cancels the earlier link, so an old unused link cannot reset the password later", async () => {
    const a = await admin();
    const email = unique("reinvited");
    await invite(a, email);
    await invite(a, email);
    const [newer, older] = await inviteTokens(email, 2);
    expect((await accept(newer!, "the real owner's secret")).status).toBe(200);

    // The attacker holds the first e-mail and tries it after the owner has set a password.
    const attacker = new Client();
    expect((await accept(older!, "the attacker's secret")).status).toBe(404);
    expect((await attacker.request("GET", "/api/sites")).status).toBe(401);
    expect((await new Client().signIn(email, "the real owner's secret")).status).toBe(200);
    expect((await new Client().signIn(email, "the attacker's secret")).status).toBe(401);
  });

  it("a link is used exactly once even when ten acceptances race", async () => {
    const a = await admin();
    const email = unique("raced");
    await invite(a, email);
    const [token] = await inviteTokens(email, 1);
    const results = await Promise.all(Array.from({ length: 10 }, (_, i) => accept(token!, `racing password number ${i}`)));
    const statuses = results.map((r) => r.status);
    expect(statuses.filter((s) => s === 200)).toHaveLength(1);
    expect(statuses.filter((s) => s !== 200).every((s) => s === 404)).toBe(true);
  });

  it("setting the password ends every other session of the user", async () => {
    const a = await admin();
    const email = unique("session-holder");
    const id = await invite(a, email);
    const [token] = await inviteTokens(email, 1);
    // A session left over for this user (e.g. created before an admin reset the account).
    await db.insert(sessions).values({ id: `stale-${Date.now()}`, userId: id, expiresAt: new Date(Date.now() + 3600_000) });
    const invitee = new Client();
    expect((await accept(token!, "a fresh long secret", invitee)).status).toBe(200);
    const left = await db.select().from(sessions).where(eq(sessions.userId, id));
    expect(left).toHaveLength(1);
    expect(invitee.cookie).toContain(left[0]!.id);
  });

  it("an admin can resend an invitation; the earlier link stops working; a user with a password cannot be re-invited", async () => {
    const a = await admin();
    const email = unique("resent");
    const id = await invite(a, email);
    const res = await a.request("POST", `/api/users/${id}/invitation`);
    expect(res.status).toBe(200);
    const [second, first] = await inviteTokens(email, 2);
    expect((await accept(first!, "the first link secret")).status).toBe(404);
    expect((await accept(second!, "the second link secret")).status).toBe(200);
    expect((await a.request("POST", `/api/users/${id}/invitation`)).status).toBe(409);
    expect((await a.request("POST", "/api/users", { email, name: "Probe Person", role: "viewer" })).status).toBe(409);
  });
});

describe("sign-in throttling", () => {
  async function accountWithPassword(password: string): Promise<string> {
    const email = unique("throttled");
    await invite(await admin(), email);
    const [token] = await inviteTokens(email, 1);
    expect((await accept(token!, password)).status).toBe(200);
    return email;
  }

  it("forty parallel guesses: five are checked (plus one per back-off that ran out meanwhile), the rest get 429 and Retry-After", async () => {
    const email = await accountWithPassword("parallel guess target");
    const xff = fakeClient();
    const started = Date.now();
    const results = await Promise.all(
      Array.from({ length: 40 }, (_, i) => new Client().request("POST", "/api/auth/sign-in", { email, password: `guess ${i}` }, { "x-forwarded-for": xff })),
    );
    const statuses = results.map((r) => r.status);
    const checked = statuses.filter((s) => s === 401).length;
    const elapsedS = (Date.now() - started) / 1000;
    // Five free attempts, then one more each time a back-off (2 s, then 4 s, 8 s …) has run out while the
    // forty were still arriving: k extra attempts need 2 + 4 + … + 2^k = 2^(k+1) − 2 seconds.
    const extra = Math.floor(Math.log2(elapsedS + 2) - 1);
    expect(checked).toBeGreaterThanOrEqual(1);
    expect(checked, `${elapsedS.toFixed(1)} s`).toBeLessThanOrEqual(5 + extra);
    expect(checked).toBeLessThan(10);
    expect(statuses.filter((s) => s === 429)).toHaveLength(40 - checked);
    const refused = results.find((r) => r.status === 429)!;
    expect(Number(refused.headers.get("retry-after"))).toBeGreaterThan(0);
  });

  it("backs off exponentially instead of locking the real user out: after the wait the right password works", async () => {
    const email = await accountWithPassword("backoff target secret");
    const xff = fakeClient();
    const c = new Client();
    const attempt = (password: string) => c.request("POST", "/api/auth/sign-in", { email, password }, { "x-forwarded-for": xff });
    for (let i = 0; i < 5; i++) expect((await attempt("wrong-password")).status).toBe(401);
    const refused = await attempt("backoff target secret");
    expect(refused.status).toBe(429);
    expect(((await refused.json()) as { error: { message: string } }).error.message).toMatch(/Too many failed sign-ins\. Try again in \d+ seconds?\./);
    const waitS = Number(refused.headers.get("retry-after"));
    // The first wait is a couple of seconds, not a lock-out of many minutes.
    expect(waitS).toBeGreaterThan(0);
    expect(waitS).toBeLessThanOrEqual(2);
    await new Promise((r) => setTimeout(r, waitS * 1000 + 300));
    expect((await attempt("backoff target secret")).status).toBe(200);
  }, 30_000);

  it("one client guessing across many accounts is stopped after 30 failures; another client is not", async () => {
    const email = await accountWithPassword("per client target");
    const xff = fakeClient();
    for (let i = 0; i < 30; i++) {
      const res = await new Client().request("POST", "/api/auth/sign-in", { email: unique(`spray-${i}`), password: "Spring2026!" }, { "x-forwarded-for": xff });
      expect(res.status).toBe(401);
    }
    const blocked = await new Client().request("POST", "/api/auth/sign-in", { email, password: "per client target" }, { "x-forwarded-for": xff });
    expect(blocked.status).toBe(429);
    expect(((await blocked.json()) as { error: { message: string } }).error.message).toMatch(/from this address/);
    const other = await new Client().request("POST", "/api/auth/sign-in", { email, password: "per client target" }, { "x-forwarded-for": fakeClient() });
    expect(other.status).toBe(200);
  }, 60_000);

  it("refuses a password over 200 characters before hashing it, and a 20 MB one without reading it whole", async () => {
    const c = new Client();
    const long = await c.request("POST", "/api/auth/sign-in", { email: "viewer@ordwise.test", password: "x".repeat(201) });
    expect(long.status).toBe(422);
    expect(((await long.json()) as { error: { fieldErrors: Record<string, string[]> } }).error.fieldErrors.password).toEqual(["Passwords have at most 200 characters"]);
    const huge = await c.request("POST", "/api/auth/sign-in", { email: "viewer@ordwise.test", password: "x".repeat(20 * 1024 * 1024) });
    expect(huge.status).toBe(413);
    const inviteHuge = await c.request("POST", "/api/invitations/accept", { token: "t".repeat(30), password: "y".repeat(20 * 1024 * 1024), confirm: "" });
    expect(inviteHuge.status).toBe(413);
  });
});

describe("sessions", () => {
  it("end 7 days after sign-in however active they are", async () => {
    const c = await signedIn("viewer");
    const id = c.cookie!.split("=")[1]!;
    // Still within the sliding 12 h window, but begun 8 days ago.
    await db
      .update(sessions)
      .set({ createdAt: new Date(Date.now() - 8 * 86_400_000), expiresAt: new Date(Date.now() + 6 * 3600_000) })
      .where(eq(sessions.id, id));
    expect((await c.request("GET", "/api/sites")).status).toBe(401);
    expect(await db.select().from(sessions).where(eq(sessions.id, id))).toHaveLength(0);
  });

  it("a session of 6 days is still valid (the absolute limit is not shorter than promised)", async () => {
    const c = await signedIn("viewer");
    const id = c.cookie!.split("=")[1]!;
    await db.update(sessions).set({ createdAt: new Date(Date.now() - 6 * 86_400_000) }).where(eq(sessions.id, id));
    expect((await c.request("GET", "/api/sites")).status).toBe(200);
  });
});
