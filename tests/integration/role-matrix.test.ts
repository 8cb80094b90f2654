// Every protected route handler and page, called as each role and anonymously.
// The expectations below are written out by hand from the product's role design, not derived
// from lib/auth/permissions.ts, so a wrong entry there makes this test fail.
import fs from "node:fs";
import path from "node:path";
import { beforeAll, describe, expect, it } from "vitest";
import { Client, signedIn, type DemoRole } from "../support/http";

type Who = DemoRole | "anonymous";
const everyone: Who[] = ["admin", "engineer", "technician", "viewer", "anonymous"];

interface RouteCase {
  method: string;
  path: string; // with :site / :user placeholders
  allowed: DemoRole[];
  body?: unknown;
}

const ALL: DemoRole[] = ["admin", "engineer", "technician", "viewer"];
const UPLOAD: DemoRole[] = ["admin", "engineer", "technician"];
const REVIEW: DemoRole[] = ["admin", "engineer"];

// Write bodies are deliberately invalid: an allowed caller gets 422 (validation runs after
// authorisation) and nothing changes, a denied one gets 403, an anonymous one 401.
// :capture is a demo capture an engineer approved, so viewers may read it.
const routes: RouteCase[] = [
  { method: "GET", path: "/api/sites", allowed: ALL },
  { method: "POST", path: "/api/sites", allowed: ["admin", "engineer", "technician"], body: {} },
  { method: "GET", path: "/api/sites/:site", allowed: ALL },
  { method: "PUT", path: "/api/sites/:site", allowed: ["admin", "engineer", "technician"], body: {} },
  { method: "GET", path: "/api/users", allowed: ["admin"] },
  { method: "POST", path: "/api/users", allowed: ["admin"], body: {} },
  { method: "PATCH", path: "/api/users/:user", allowed: ["admin"], body: {} },
  // :user has a password already, so an allowed caller is told so (409) and nothing is sent.
  { method: "POST", path: "/api/users/:user/invitation", allowed: ["admin"] },
  { method: "GET", path: "/api/dev/mailbox", allowed: ["admin"] },
  { method: "POST", path: "/api/auth/sign-out", allowed: ALL },
  { method: "GET", path: "/api/captures", allowed: ALL },
  { method: "POST", path: "/api/captures", allowed: UPLOAD, body: {} },
  { method: "GET", path: "/api/captures/:capture", allowed: ALL },
  // Withdrawal and kind switch go to a capture that does not exist (404) so nothing changes.
  { method: "PATCH", path: "/api/captures/:missing", allowed: UPLOAD, body: { kind: "waveform" } },
  { method: "DELETE", path: "/api/captures/:missing", allowed: UPLOAD },
  { method: "POST", path: "/api/captures/:capture/uploaded", allowed: UPLOAD },
  { method: "GET", path: "/api/captures/:capture/preview", allowed: UPLOAD },
  { method: "PUT", path: "/api/captures/:capture/setup", allowed: UPLOAD, body: {} },
  // :capture is a waveform record: an allowed caller is told so (409), nothing else happens.
  { method: "GET", path: "/api/captures/:capture/interval-preview", allowed: UPLOAD },
  { method: "PUT", path: "/api/captures/:capture/interval-setup", allowed: UPLOAD, body: {} },
  // An allowed caller would start a real run, so this one goes to a capture that does not exist (404).
  { method: "POST", path: "/api/captures/:missing/analyze", allowed: UPLOAD },
  { method: "GET", path: "/api/captures/:capture/charts", allowed: ALL },
  { method: "GET", path: "/api/captures/:capture/evaluations", allowed: ALL },
  { method: "POST", path: "/api/captures/:capture/evaluations", allowed: REVIEW, body: {} },
  { method: "POST", path: "/api/captures/:capture/review", allowed: UPLOAD, body: {} },
  { method: "GET", path: "/api/captures/:capture/shares", allowed: REVIEW },
  { method: "POST", path: "/api/captures/:capture/shares", allowed: REVIEW, body: { expiresInDays: 0 } },
  { method: "DELETE", path: "/api/captures/:capture/shares/:missing", allowed: REVIEW },
  { method: "GET", path: "/api/captures/:capture/report", allowed: ALL },
  { method: "GET", path: "/api/captures/:capture/sheet-csv", allowed: ALL },
  { method: "GET", path: "/api/captures/:capture/diagnosis", allowed: ALL },
  { method: "GET", path: "/api/captures/:capture/studies", allowed: ALL },
  { method: "POST", path: "/api/captures/:capture/studies", allowed: REVIEW, body: {} },
  { method: "POST", path: "/api/captures/:capture/studies/preview", allowed: ALL, body: {} },
  // Limit sets: :missing is a well-formed key of no set, so an allowed caller gets 404 or 422 and nothing changes.
  { method: "GET", path: "/api/limit-sets", allowed: ALL },
  { method: "GET", path: "/api/limit-sets/:missing", allowed: ALL },
  { method: "PUT", path: "/api/limit-sets/:missing", allowed: ["admin"], body: {} },
  { method: "GET", path: "/api/limit-sets/:missing/revisions", allowed: ALL },
  { method: "GET", path: "/api/limit-sets/:missing/revisions/:missing", allowed: ALL },
  { method: "POST", path: "/api/limit-sets/:missing/clone", allowed: ["admin"], body: {} },
  { method: "GET", path: "/api/limit-sets/:missing/export", allowed: ALL },
  { method: "POST", path: "/api/limit-sets/import", allowed: ["admin"], body: {} },
];

// Routes that need no session by design.
const publicRoutes = ["POST /api/auth/sign-in", "POST /api/invitations/accept", "GET /api/shared/[token]/report", "GET /api/shared/[token]/charts"];

const pages: { path: string; allowed: DemoRole[] }[] = [
  { path: "/captures", allowed: ALL },
  { path: "/sites", allowed: ALL },
  { path: "/sites/new", allowed: ["admin", "engineer", "technician"] },
  { path: "/sites/:site", allowed: ALL },
  { path: "/admin/users", allowed: ["admin"] },
  { path: "/dev/mailbox", allowed: ["admin"] },
  { path: "/captures/new", allowed: UPLOAD },
  { path: "/captures/:capture/setup", allowed: UPLOAD },
  { path: "/captures/:capture", allowed: ALL },
  { path: "/captures/compare?a=:capture", allowed: ALL },
  { path: "/limits", allowed: ALL },
  { path: "/limits/iec-61000-3-2-class-a", allowed: ALL },
  { path: "/limits/iec-61000-3-2-class-a/edit", allowed: ["admin"] },
  { path: "/limits/iec-61000-3-2-class-a/revisions", allowed: ALL },
  { path: "/limits/iec-61000-3-2-class-a/revisions/1", allowed: ALL },
];

function routeFiles(dir: string): string[] {
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((e) => {
    const p = path.join(dir, e.name);
    return e.isDirectory() ? routeFiles(p) : e.name === "route.ts" ? [p] : [];
  });
}

let siteId = "";
let userId = "";
let captureId = "";
const clients = new Map<Who, Client>();

beforeAll(async () => {
  for (const role of ALL) clients.set(role, await signedIn(role));
  clients.set("anonymous", new Client());
  const admin = clients.get("admin")!;
  const sites = (await (await admin.request("GET", "/api/sites")).json()) as { sites: { id: string }[] };
  siteId = sites.sites[0]!.id;
  const users = (await (await admin.request("GET", "/api/users")).json()) as { users: { id: string; email: string }[] };
  userId = users.users.find((u) => u.email === "viewer@ordwise.test")!.id;
  const list = (await (await admin.request("GET", "/api/captures")).json()) as { items: { id: string; reviewState: string }[] };
  captureId = list.items.find((c) => c.reviewState === "approved")!.id;
});

const missingId = "00000000-0000-4000-8000-000000000000";
const fill = (p: string) =>
  p.replace(":site", siteId).replace(":user", userId).replace(":capture", captureId).replaceAll(":missing", missingId);

describe("role matrix — route handlers", () => {
  it("covers every exported method of every route handler", () => {
    const root = path.resolve(__dirname, "../../app/api");
    const found = routeFiles(root).flatMap((file) => {
      const src = fs.readFileSync(file, "utf8");
      const url = "/api/" + path.relative(root, path.dirname(file)).split(path.sep).join("/");
      return [...src.matchAll(/export const (GET|POST|PUT|PATCH|DELETE)\b/g)].map((m) => `${m[1]} ${url}`);
    });
    const normalise = (s: string) => s.replace(/\[[^\]]+\]/g, ":param").replace(/:(site|user|capture|missing)\b/g, ":param");
    const listed = [...routes.map((r) => `${r.method} ${r.path}`), ...publicRoutes].map(normalise).sort();
    expect(found.map(normalise).sort()).toEqual(listed);
  });

  for (const route of routes) {
    for (const who of everyone) {
      const allowed = who !== "anonymous" && route.allowed.includes(who);
      it(`${route.method} ${route.path} as ${who} → ${allowed ? "allowed" : "refused"}`, async () => {
        // Sign-out ends the session it is called with, so it runs on a fresh one.
        const client = route.path === "/api/auth/sign-out" && who !== "anonymous" ? await signedIn(who) : clients.get(who)!;
        const res = await client.request(route.method, fill(route.path), route.body);
        if (who === "anonymous") expect(res.status).toBe(401);
        else if (!allowed) expect(res.status).toBe(403);
        else {
          // Allowed means authorised: the handler ran (200/201/202, 404 for a missing record, 409 for a
          // state conflict, 422 for the deliberately invalid body), never 401/403 or a server error.
          expect([200, 201, 202, 404, 409, 422]).toContain(res.status);
        }
      });
    }
  }
});

describe("role matrix — pages", () => {
  for (const page of pages) {
    for (const who of everyone) {
      const allowed = who !== "anonymous" && page.allowed.includes(who);
      it(`${page.path} as ${who} → ${who === "anonymous" ? "sign-in" : allowed ? "shown" : "403"}`, async () => {
        const res = await clients.get(who)!.request("GET", fill(page.path));
        if (who === "anonymous") {
          expect(res.status).toBe(307);
          expect(res.headers.get("location")).toContain("/sign-in");
        } else expect(res.status).toBe(allowed ? 200 : 403);
      });
    }
  }
});
