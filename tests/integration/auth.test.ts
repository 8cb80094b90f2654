import { eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { sessions, users } from "@/db/schema";
import { Client, signedIn, waitForMail } from "../support/http";

describe("sign-in, sessions and sign-out", () => {
  it("signs in, the session validates, sign-out invalidates it", async () => {
    const c = await signedIn("engineer");
    expect(c.cookie).toMatch(/^ordwise_session=/);
    const stolen = c.cookie;
    expect((await c.request("GET", "/api/sites")).status).toBe(200);
    expect((await c.request("POST", "/api/auth/sign-out")).status).toBe(200);
    // The old cookie no longer works anywhere.
    const replay = new Client();
    replay.cookie = stolen;
    expect((await replay.request("GET", "/api/sites")).status).toBe(401);
  });

  it("refuses a wrong password without saying which part was wrong", async () => {
    const c = new Client();
    const res = await c.signIn("viewer@ordwise.test", "not-the-password");
    expect(res.status).toBe(401);
    const body = (await res.json()) as { error: { message: string } };
    expect(body.error.message).toMatch(/e-mail or password/);
    expect(c.cookie).toBeNull();
  });

  it("treats an expired session as signed out", async () => {
    const c = await signedIn("technician");
    const id = c.cookie!.split("=")[1]!;
    await db.update(sessions).set({ expiresAt: new Date(Date.now() - 1000) }).where(eq(sessions.id, id));
    expect((await c.request("GET", "/api/sites")).status).toBe(401);
  });

  it("throttles an address after five failed sign-ins, even with the right password", async () => {
    const email = `throttle-${Date.now()}@ordwise.test`;
    const admin = await signedIn("admin");
    // A real account, so a correct password would otherwise succeed.
    const invite = await admin.request("POST", "/api/users", { email, name: "Throttle Probe", role: "viewer" });
    expect(invite.status).toBe(201);
    const mail = await waitForMail(email);
    const token = /\/invite\/([a-z0-9]+)/.exec(mail.text)![1]!;
    const invitee = new Client();
    expect((await invitee.request("POST", "/api/invitations/accept", { token, password: "correct horse battery", confirm: "correct horse battery" })).status).toBe(200);

    const c = new Client();
    for (let i = 0; i < 5; i++) expect((await c.signIn(email, "wrong-password")).status).toBe(401);
    const locked = await c.signIn(email, "correct horse battery");
    expect(locked.status).toBe(429);
    expect(((await locked.json()) as { error: { message: string } }).error.message).toMatch(/Too many failed sign-ins/);
  });

  it("refuses state-changing requests from another origin", async () => {
    const c = await signedIn("admin");
    const res = await c.request("POST", "/api/sites", { name: "Cross" }, { origin: "http://evil.example" });
    expect(res.status).toBe(403);
  });
});

describe("invitations", () => {
  it("e-mails a one-time link through the SMTP catcher; the invitee sets a password and is signed in", async () => {
    const email = `new-tech-${Date.now()}@ordwise.test`;
    const admin = await signedIn("admin");
    const res = await admin.request("POST", "/api/users", { email, name: "Nova Tremaine", role: "technician" });
    expect(res.status).toBe(201);

    const mail = await waitForMail(email);
    expect(mail.subject).toBe("Your Ordwise account");
    const link = /(http\S+\/invite\/[a-z0-9]+)/.exec(mail.text)?.[1];
    // An absolute link on the app's own origin.
    expect(link?.startsWith(new URL("/invite/", process.env.APP_URL).toString())).toBe(true);
    const token = link!.split("/invite/")[1]!;

    const page = await fetch(link!);
    expect(page.status).toBe(200);
    expect(await page.text()).toContain("Nova Tremaine");

    const invitee = new Client();
    const weak = await invitee.request("POST", "/api/invitations/accept", { token, password: "short", confirm: "short" });
    expect(weak.status).toBe(422);
    const ok = await invitee.request("POST", "/api/invitations/accept", { token, password: "a long enough secret", confirm: "a long enough secret" });
    expect(ok.status).toBe(200);
    expect((await invitee.request("GET", "/api/sites")).status).toBe(200);
    // Technicians cannot manage users.
    expect((await invitee.request("GET", "/api/users")).status).toBe(403);
    // The link works once.
    const again = await new Client().request("POST", "/api/invitations/accept", { token, password: "another long secret", confirm: "another long secret" });
    expect(again.status).toBe(404);

    const [row] = await db.select().from(users).where(eq(users.email, email));
    expect(row?.passwordHash).toMatch(/^\$argon2id\$/);
  });

  it("deactivating a user ends their sessions and blocks sign-in", async () => {
    const email = `leaver-${Date.now()}@ordwise.test`;
    const admin = await signedIn("admin");
    const created = (await (await admin.request("POST", "/api/users", { email, name: "Leaver Person", role: "viewer" })).json()) as { user: { id: string } };
    const mail = await waitForMail(email);
    const token = /\/invite\/([a-z0-9]+)/.exec(mail.text)![1]!;
    const leaver = new Client();
    await leaver.request("POST", "/api/invitations/accept", { token, password: "leaver password 1", confirm: "leaver password 1" });
    expect((await leaver.request("GET", "/api/sites")).status).toBe(200);

    expect((await admin.request("PATCH", `/api/users/${created.user.id}`, { active: false })).status).toBe(200);
    expect((await leaver.request("GET", "/api/sites")).status).toBe(401);
    expect((await new Client().signIn(email, "leaver password 1")).status).toBe(401);
  });
});
