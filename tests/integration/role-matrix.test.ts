// Every protected route handler and page, called as each role and anonymously.
// The expectations below are written out by hand from the product's role design, not derived
// from lib/auth/permissions.ts, so a wrong entry there makes this test fail.
import fs from "node:fs";
import path from "node:path";
import { beforeAll, describe, expect, it } from "vitest";
import { listedCapture } from "../support/captures";
import { Client, signedIn, type DemoRole } from "../support/http";

type Who = DemoRole | "anonymous";
const everyone: Who[] = ["admin", "engineer", "technician", "viewer", "anonymous"];

interface RouteCase {
  method: string;
  path: string; // with :site / :user placeholders
  allowed: DemoRole[];
  body?: unknown;
  /** The exact status an allowed caller gets (written out by hand: what the handler answers once authorised). */
  status: number;
}

const ALL: DemoRole[] = ["admin", "engineer", "technician", "viewer"];
const UPLOAD: DemoRole[] = ["admin", "engineer", "technician"];
const REVIEW: DemoRole[] = ["admin", "engineer"];

// Write bodies are deliberately invalid: an allowed caller gets 422 (validation runs after
// authorisation) and nothing changes, a denied one gets 403, an anonymous one 401.
// :capture is a demo capture an engineer approved at a site of the demo viewer's customer, so that
// viewer may read it; the technician uploaded and submitted it, so the technician may no longer change it.
// :site is that capture's site.
const EDIT_SUBMITTED: DemoRole[] = ["admin", "engineer"];
const routes: RouteCase[] = [
  { method: "GET", path: "/api/sites", allowed: ALL, status: 200 },
  // Technicians may add a site; changing one is an engineer's.
  { method: "POST", path: "/api/sites", allowed: ["admin", "engineer", "technician"], body: {}, status: 422 },
  { method: "GET", path: "/api/sites/:site", allowed: ALL, status: 200 },
  { method: "PUT", path: "/api/sites/:site", allowed: ["admin", "engineer"], body: {}, status: 422 },
  { method: "GET", path: "/api/customers", allowed: ["admin"], status: 200 },
  { method: "POST", path: "/api/customers", allowed: ["admin"], body: {}, status: 422 },
  { method: "PUT", path: "/api/customers/:missing", allowed: ["admin"], body: {}, status: 422 },
  { method: "GET", path: "/api/users", allowed: ["admin"], status: 200 },
  { method: "POST", path: "/api/users", allowed: ["admin"], body: {}, status: 422 },
  { method: "PATCH", path: "/api/users/:user", allowed: ["admin"], body: {}, status: 422 },
  // :user has a password already, so an allowed caller is told so (409) and nothing is sent.
  { method: "POST", path: "/api/users/:user/invitation", allowed: ["admin"], status: 409 },
  { method: "GET", path: "/api/dev/mailbox", allowed: ["admin"], status: 200 },
  { method: "POST", path: "/api/auth/sign-out", allowed: ALL, status: 200 },
  { method: "GET", path: "/api/captures", allowed: ALL, status: 200 },
  { method: "POST", path: "/api/captures", allowed: UPLOAD, body: {}, status: 422 },
  { method: "GET", path: "/api/captures/:capture", allowed: ALL, status: 200 },
  // Withdrawal and kind switch go to a capture that does not exist (404) so nothing changes.
  { method: "PATCH", path: "/api/captures/:missing", allowed: UPLOAD, body: { kind: "waveform" }, status: 404 },
  { method: "DELETE", path: "/api/captures/:missing", allowed: UPLOAD, status: 404 },
  { method: "POST", path: "/api/captures/:capture/uploaded", allowed: EDIT_SUBMITTED, status: 409 },
  { method: "GET", path: "/api/captures/:capture/preview", allowed: UPLOAD, status: 200 },
  { method: "PUT", path: "/api/captures/:capture/setup", allowed: EDIT_SUBMITTED, body: {}, status: 422 },
  // :capture is a waveform record: an allowed caller is told so (409), nothing else happens.
  { method: "GET", path: "/api/captures/:capture/interval-preview", allowed: UPLOAD, status: 409 },
  { method: "PUT", path: "/api/captures/:capture/interval-setup", allowed: EDIT_SUBMITTED, body: {}, status: 422 },
  // An allowed caller would start a real run, so this one goes to a capture that does not exist (404).
  { method: "POST", path: "/api/captures/:missing/analyze", allowed: UPLOAD, status: 404 },
  { method: "GET", path: "/api/captures/:capture/charts", allowed: ALL, status: 200 },
  // Without its required ?evaluation= an allowed caller is told so (422).
  { method: "GET", path: "/api/captures/:capture/sheet-body", allowed: ALL, status: 422 },
  { method: "GET", path: "/api/captures/:capture/evaluations", allowed: ALL, status: 200 },
  { method: "POST", path: "/api/captures/:capture/evaluations", allowed: REVIEW, body: {}, status: 422 },
  { method: "POST", path: "/api/captures/:capture/review", allowed: UPLOAD, body: {}, status: 422 },
  { method: "GET", path: "/api/captures/:capture/shares", allowed: REVIEW, status: 200 },
  { method: "POST", path: "/api/captures/:capture/shares", allowed: REVIEW, body: { expiresInDays: 0 }, status: 422 },
  { method: "DELETE", path: "/api/captures/:capture/shares/:missing", allowed: REVIEW, status: 404 },
  { method: "GET", path: "/api/captures/:capture/report", allowed: ALL, status: 200 },
  { method: "GET", path: "/api/captures/:capture/sheet-csv", allowed: ALL, status: 200 },
  { method: "GET", path: "/api/captures/:capture/diagnosis", allowed: ALL, status: 200 },
  { method: "GET", path: "/api/captures/:capture/studies", allowed: ALL, status: 200 },
  { method: "POST", path: "/api/captures/:capture/studies", allowed: REVIEW, body: {}, status: 422 },
  // Viewers read saved studies but run no new what-ifs.
  { method: "POST", path: "/api/captures/:capture/studies/preview", allowed: UPLOAD, body: {}, status: 422 },
  // Limit sets: :missing is a well-formed key of no set and :revision a well-formed revision number, so an allowed
  // reader gets 404; a write gets 422 (its body or its revision segment is invalid) and nothing changes.
  { method: "GET", path: "/api/limit-sets", allowed: ALL, status: 200 },
  { method: "GET", path: "/api/limit-sets/:missing", allowed: ALL, status: 404 },
  { method: "PUT", path: "/api/limit-sets/:missing", allowed: ["admin"], body: {}, status: 422 },
  { method: "GET", path: "/api/limit-sets/:missing/revisions", allowed: ALL, status: 404 },
  { method: "GET", path: "/api/limit-sets/:missing/revisions/:revision", allowed: ALL, status: 404 },
  { method: "GET", path: "/api/limit-sets/:missing/revisions/:revision/verifications", allowed: ALL, status: 404 },
  { method: "POST", path: "/api/limit-sets/:missing/revisions/:missing/verifications", allowed: ["admin"], body: {}, status: 422 },
  { method: "POST", path: "/api/limit-sets/:missing/clone", allowed: ["admin"], body: {}, status: 422 },
  { method: "GET", path: "/api/limit-sets/:missing/export", allowed: ALL, status: 404 },
  { method: "POST", path: "/api/limit-sets/import", allowed: ["admin"], body: {}, status: 422 },
];

// Routes that need no session by design.
const publicRoutes = ["POST /api/auth/sign-in", "POST /api/invitations/accept", "GET /api/shared/[token]/report", "GET /api/shared/[token]/charts"];

const pages: { path: string; allowed: DemoRole[] }[] = [
  { path: "/captures", allowed: ALL },
  { path: "/sites", allowed: ALL },
  { path: "/sites/new", allowed: ["admin", "engineer", "technician"] },
  { path: "/sites/:site", allowed: ALL },
  { path: "/admin/users", allowed: ["admin"] },
  { path: "/admin/customers", allowed: ["admin"] },
  { path: "/dev/mailbox", allowed: ["admin"] },
  { path: "/captures/new", allowed: UPLOAD },
  { path: "/captures/:capture/setup", allowed: EDIT_SUBMITTED },
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
  const users = (await (await admin.request("GET", "/api/users")).json()) as { users: { id: string; email: string }[] };
  userId = users.users.find((u) => u.email === "viewer@ordwise.test")!.id;
  // From the demo viewer's own list (approved captures of her customer's sites only): the demo's approved capture,
  // found page by page (other tests add captures in front of it).
  const mine = await listedCapture<{ id: string; title: string; siteId: string }>(clients.get("viewer")!, "Compressor drives at full load — after filter");
  captureId = mine.id;
  siteId = mine.siteId;
});

const missingId = "00000000-0000-4000-8000-000000000000";
const fill = (p: string) =>
  p.replace(":site", siteId).replace(":user", userId).replace(":capture", captureId).replaceAll(":missing", missingId).replace(":revision", "1");

describe("role matrix — route handlers", () => {
  it("covers every exported method of every route handler", () => {
    const root = path.resolve(__dirname, "../../app/api");
    const found = routeFiles(root).flatMap((file) => {
      const src = fs.readFileSync(file, "utf8");
      const url = "/api/" + path.relative(root, path.dirname(file)).split(path.sep).join("/");
      return [...src.matchAll(/export const (GET|POST|PUT|PATCH|DELETE)\b/g)].map((m) => `${m[1]} ${url}`);
    });
    const normalise = (s: string) => s.replace(/\[[^\]]+\]/g, ":param").replace(/:(site|user|capture|missing|revision)\b/g, ":param");
    const listed = [...routes.map((r) => `${r.method} ${r.path}`), ...publicRoutes].map(normalise).sort();
    expect(found.map(normalise).sort()).toEqual(listed);
  });

  for (const route of routes) {
    for (const who of everyone) {
      const allowed = who !== "anonymous" && route.allowed.includes(who);
      it(`${route.method} ${route.path} as ${who} → ${allowed ? `allowed (${route.status})` : "refused"}`, async () => {
        // Sign-out ends the session it is called with, so it runs on a fresh one.
        const client = route.path === "/api/auth/sign-out" && who !== "anonymous" ? await signedIn(who) : clients.get(who)!;
        const res = await client.request(route.method, fill(route.path), route.body);
        if (who === "anonymous") expect(res.status).toBe(401);
        else if (!allowed) expect(res.status).toBe(403);
        // Allowed means authorised: the handler ran and answered exactly what it answers once past the
        // role check — 200 for a read, 422 for the deliberately invalid body, 404 only where the path
        // names a record that does not exist, 409 for a state conflict.
        else expect(res.status).toBe(route.status);
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

// Object level: roles are not enough. A viewer belongs to a customer and reads only the approved sheets of
// that customer's sites; a technician changes only the captures they uploaded, until they are submitted.
describe("role matrix — object level", () => {
  let otherCaptureId = "";
  let otherSiteId = "";
  let otherTitle = "";
  let ownApprovalComment = "";

  beforeAll(async () => {
    const admin = clients.get("admin")!;
    const viewer = clients.get("viewer")!;
    // The demo scenario approves a capture at a site of another customer (Bench B); the viewer must not see it.
    // The list is paged and other tests add captures, so every page of analysed captures is searched; a capture
    // counts as approved by its approved verdict (a test judging it again moves its review state on, and the
    // approved sheet stays what its customer reads).
    type Listed = { id: string; siteId: string; title: string; approvedVerdict: string | null };
    let other: Listed | undefined;
    for (let page = 1; page <= 50 && !other; page++) {
      const { items } = (await (await admin.request("GET", `/api/captures?status=done&page=${page}`)).json()) as { items: Listed[] };
      if (items.length === 0) break;
      for (const c of items) {
        if (c.approvedVerdict === null) continue;
        if ((await viewer.request("GET", `/api/captures/${c.id}`)).status === 404) {
          other = c;
          break;
        }
      }
    }
    expect(other).toBeDefined();
    if (!other) return;
    otherCaptureId = other.id;
    otherSiteId = other.siteId;
    otherTitle = other.title;
    const review = (await (await admin.request("GET", `/captures/${captureId}`)).text());
    // The demo engineer's approval comment on the viewer's own capture (internal; never shown to a viewer).
    ownApprovalComment = "Approved for the utility submission";
    expect(review).toContain(ownApprovalComment);
  });

  const viewerReads = [
    "/api/captures/:other",
    "/api/captures/:other/charts",
    "/api/captures/:other/evaluations",
    "/api/captures/:other/report",
    "/api/captures/:other/sheet-csv",
    "/api/sites/:otherSite",
  ];
  for (const p of viewerReads) {
    it(`a viewer of another customer gets 404 for GET ${p}; an engineer gets 200`, async () => {
      const real = p.replace(":otherSite", otherSiteId).replace(":other", otherCaptureId);
      expect((await clients.get("viewer")!.request("GET", real)).status).toBe(404);
      expect((await clients.get("engineer")!.request("GET", real)).status).toBe(200);
    });
  }

  it("a viewer holding a copied ETag of another customer's chart data still gets 404, never 304", async () => {
    const engineer = clients.get("engineer")!;
    const { evaluations: list } = (await (await engineer.request("GET", `/api/captures/${otherCaptureId}/evaluations`)).json()) as { evaluations: { id: string }[] };
    for (const query of ["", `?evaluation=${list[0]!.id}`]) {
      const url = `/api/captures/${otherCaptureId}/charts${query}`;
      const tag = (await engineer.request("GET", url, undefined, { "accept-encoding": "gzip" })).headers.get("etag")!;
      expect(tag).toMatch(/^"[0-9a-f-]{36}-gzip"$/);
      expect((await engineer.request("GET", url, undefined, { "accept-encoding": "gzip", "if-none-match": tag })).status).toBe(304);
      expect((await clients.get("viewer")!.request("GET", url, undefined, { "accept-encoding": "gzip", "if-none-match": tag })).status).toBe(404);
    }
    // Its sheet body, keyed by the same evaluation id, likewise.
    const body = `/api/captures/${otherCaptureId}/sheet-body?evaluation=${list[0]!.id}`;
    const bodyTag = (await engineer.request("GET", body, undefined, { "accept-encoding": "gzip" })).headers.get("etag")!;
    expect(bodyTag).toMatch(/^"[0-9a-f-]{36}\.1-gzip"$/);
    expect((await engineer.request("GET", body, undefined, { "accept-encoding": "gzip", "if-none-match": bodyTag })).status).toBe(304);
    expect((await clients.get("viewer")!.request("GET", body, undefined, { "accept-encoding": "gzip", "if-none-match": bodyTag })).status).toBe(404);
  });

  it("a viewer of another customer gets 404 for the sheet and site pages, and the compare page shows nothing of it", async () => {
    const viewer = clients.get("viewer")!;
    expect((await viewer.request("GET", `/captures/${otherCaptureId}`)).status).toBe(404);
    expect((await viewer.request("GET", `/sites/${otherSiteId}`)).status).toBe(404);
    const compare = await viewer.request("GET", `/captures/compare?a=${otherCaptureId}`);
    expect(await compare.text()).not.toContain(otherTitle);
    expect((await clients.get("engineer")!.request("GET", `/captures/${otherCaptureId}`)).status).toBe(200);
  });

  it("a viewer's lists hold only their customer's sites and captures", async () => {
    const viewer = clients.get("viewer")!;
    const sites = (await (await viewer.request("GET", "/api/sites")).json()) as { sites: { id: string }[] };
    expect(sites.sites.map((s) => s.id)).toContain(siteId);
    expect(sites.sites.map((s) => s.id)).not.toContain(otherSiteId);
    const list = (await (await viewer.request("GET", "/api/captures")).json()) as { items: { id: string; siteId: string }[] };
    expect(list.items.map((c) => c.id)).toContain(captureId);
    expect(list.items.every((c) => c.siteId === siteId)).toBe(true);
    const byFilter = (await (await viewer.request("GET", `/api/captures?site=${otherSiteId}`)).json()) as { items: unknown[] };
    expect(byFilter.items).toEqual([]);
    const sitesPage = await (await viewer.request("GET", "/sites")).text();
    expect(sitesPage).not.toContain("Bench B");
    expect(sitesPage).not.toContain("Harrowgate");
  });

  it("a viewer's own sheet, PDF and CSV carry no internal review comments; the engineer's sheet does", async () => {
    const viewer = clients.get("viewer")!;
    const page = await viewer.request("GET", `/captures/${captureId}`);
    expect(page.status).toBe(200);
    expect(await page.text()).not.toContain(ownApprovalComment);
    const csv = await viewer.request("GET", `/api/captures/${captureId}/sheet-csv`);
    expect(csv.status).toBe(200);
    expect(await csv.text()).not.toContain(ownApprovalComment);
  });

  it("a technician changes only the captures they uploaded, and only until submitted", async () => {
    const engineer = clients.get("engineer")!;
    const tech = clients.get("technician")!;
    const register = (who: Client, title: string) =>
      who.request("POST", "/api/captures", { siteId: otherSiteId, title, filename: "x.csv", sizeBytes: 100 });
    const theirs = (await (await register(engineer, `Object-level engineer draft ${Date.now()}`)).json()) as { capture: { id: string } };
    const mine = (await (await register(tech, `Object-level technician draft ${Date.now()}`)).json()) as { capture: { id: string } };
    // Someone else's draft: refused before anything is read from the body.
    expect((await tech.request("PUT", `/api/captures/${theirs.capture.id}/setup`, {})).status).toBe(403);
    expect((await tech.request("PUT", `/api/captures/${theirs.capture.id}/interval-setup`, {})).status).toBe(403);
    expect((await tech.request("POST", `/api/captures/${theirs.capture.id}/uploaded`)).status).toBe(403);
    expect((await tech.request("POST", `/api/captures/${theirs.capture.id}/analyze`)).status).toBe(403);
    expect((await tech.request("POST", `/api/captures/${theirs.capture.id}/review`, { action: "submitted", comment: "" })).status).toBe(403);
    expect((await tech.request("GET", `/captures/${theirs.capture.id}/setup`)).status).toBe(403);
    // Their own draft: authorised (the empty body is then invalid).
    expect((await tech.request("PUT", `/api/captures/${mine.capture.id}/setup`, {})).status).toBe(422);
    expect((await tech.request("GET", `/captures/${mine.capture.id}/setup`)).status).toBe(200);
    // The engineer may change anyone's capture.
    expect((await engineer.request("PUT", `/api/captures/${theirs.capture.id}/setup`, {})).status).toBe(422);
  });
});
