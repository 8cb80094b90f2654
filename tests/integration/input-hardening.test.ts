// Hostile input never answers 500 (issue 10 §4). Every route handler under app/api is found at test time
// and called, signed in as admin, with NUL characters, an oversized body, bodies of the wrong type,
// the wrong content type, malformed and deeply nested JSON, control characters in path parameters and
// methods it does not export. Specific cases check the exact answer (415, 413, 422 naming the field, 405 JSON).
import fs from "node:fs";
import path from "node:path";
import { beforeAll, describe, expect, it } from "vitest";
import { demoCaptureId } from "../support/captures";
import { appUrl } from "../support/env";
import { Client, signedIn } from "../support/http";

interface Route {
  url: string; // with [param] segments
  file: string;
  methods: string[];
  readsJson: boolean;
  /** The body cap the route passes to readJson, bytes (the default 256 kB when it passes none). */
  maxJsonBytes: number;
}

function discoverRoutes(): Route[] {
  const root = path.resolve(__dirname, "../../app/api");
  const walk = (dir: string): string[] =>
    fs.readdirSync(dir, { withFileTypes: true }).flatMap((e) => {
      const p = path.join(dir, e.name);
      return e.isDirectory() ? walk(p) : e.name === "route.ts" ? [p] : [];
    });
  return walk(root).map((file) => {
    const src = fs.readFileSync(file, "utf8");
    return {
      file,
      url: "/api/" + path.relative(root, path.dirname(file)).split(path.sep).join("/"),
      methods: [...src.matchAll(/export\s+(?:const|async\s+function|function)\s+(GET|POST|PUT|PATCH|DELETE)\b/g)].map((m) => m[1]!),
      // The two set-up routes read their body through captureSetupRoute (lib/api/capture-setup-route.ts).
      readsJson: src.includes("readJson(req") || src.includes("captureSetupRoute("),
      maxJsonBytes: Number(/readJson\(req, \{ maxBytes: (\d+) \* 1024 \}\)/.exec(src)?.[1] ?? 256) * 1024,
    };
  });
}

const routes = discoverRoutes();
const missingId = "00000000-0000-4000-8000-000000000000";
let captureId = "";
let admin: Client;

beforeAll(async () => {
  admin = await signedIn("admin");
  // An approved demo capture, found by title (other test files add captures in front of it).
  captureId = await demoCaptureId(admin, "Compressor drives at full load — after filter");
});

/**
 * Fills the dynamic segments. Reads go to a real capture and limit set; writes go to records that do not
 * exist, so a request that slipped through validation could still change nothing. The set-up writes are
 * the exception: they authorise against the capture before reading the body (a missing one is 404), so
 * they go to a real capture — an approved one, whose set-up no hostile body could change anyway.
 */
function fill(url: string, method: string): string {
  const write = method !== "GET";
  const setupWrite = /\/(interval-)?setup$/.test(url);
  return url
    .replace("[id]", url.startsWith("/api/users") ? "no-such-user" : write && !setupWrite ? missingId : captureId)
    .replace("[shareId]", missingId)
    .replace("[key]", write ? "no-such-set" : "iec-61000-3-2-class-a")
    .replace("[number]", "1")
    .replace("[token]", "not-a-real-share-token")
    .replace(/\[[^\]]+\]/g, missingId);
}

/** Sends a raw body with the given content type through the admin's session (sign-out gets a session of its own). */
async function send(method: string, url: string, body: string | undefined, contentType: string | null, client?: Client): Promise<Response> {
  const c = client ?? (url === "/api/auth/sign-out" ? await signedIn("admin") : admin);
  const headers: Record<string, string> = { origin: appUrl() };
  if (contentType) headers["content-type"] = contentType;
  if (c.cookie) headers.cookie = c.cookie;
  return fetch(new URL(url, appUrl()), { method, headers, body, redirect: "manual" });
}

const nul = "ab\u0000cd";
const nulBody = JSON.stringify({
  name: nul, email: `x${nul}@ordwise.test`, title: nul, filename: `${nul}.csv`, comment: nul, label: nul, address: nul,
  notes: nul, reason: nul, key: nul, token: nul, password: nul, confirm: nul, action: nul, siteId: nul, limitSetKey: nul,
  content: { key: nul, name: nul }, mapping: { channels: { [nul]: { quantity: "current" } } }, context: { note: nul },
});
const deepBody = "[".repeat(5000) + "]".repeat(5000);
const oversizedBody = JSON.stringify({ name: "x".repeat(2 * 1024 * 1024) });
const wrongTypes = ["[]", '"a string"', "42", "null", "true", JSON.stringify({ name: 5, email: [], title: {}, action: 1, content: "x" })];

interface Probe {
  what: string;
  body: string | undefined;
  contentType: string | null;
}
const probes: Probe[] = [
  { what: "NUL in every text field", body: nulBody, contentType: "application/json" },
  { what: "a 2 MB body", body: oversizedBody, contentType: "application/json" },
  ...wrongTypes.map((b) => ({ what: `wrong type ${b.slice(0, 20)}`, body: b, contentType: "application/json" })),
  { what: "text/plain", body: nulBody, contentType: "text/plain" },
  { what: "a form", body: "name=a%00b", contentType: "application/x-www-form-urlencoded" },
  { what: "no content type", body: "{}", contentType: null },
  { what: "malformed JSON", body: '{"name": "a', contentType: "application/json" },
  { what: "invalid UTF-8", body: undefined, contentType: "application/json" }, // body set below
  { what: "JSON nested 5000 deep", body: deepBody, contentType: "application/json" },
];

async function expectNoServerError(res: Response, label: string): Promise<void> {
  const text = await res.text();
  expect(res.status, `${label} → ${res.status} ${text.slice(0, 200)}`).toBeLessThan(500);
  if (res.status >= 400) {
    expect(res.headers.get("content-type") ?? "", `${label}: error answers are JSON`).toContain("application/json");
  }
}

describe("every route handler, signed in as admin, with hostile input", () => {
  it("finds the route handlers", () => {
    expect(routes.length).toBeGreaterThan(25);
  });

  for (const route of routes) {
    for (const method of route.methods) {
      it(`${method} ${route.url}: no 500 for NUL, oversized, wrong-type and wrong-content-type bodies`, async () => {
        const url = fill(route.url, method);
        for (const probe of probes) {
          const body = probe.what === "invalid UTF-8" ? (Buffer.from([0x7b, 0x22, 0x61, 0x22, 0x3a, 0x22, 0xff, 0xfe, 0x22, 0x7d]) as unknown as string) : probe.body;
          if (method === "GET" || method === "DELETE") {
            // No body on reads; hostile query strings instead.
            const res = await send(method, `${url}?to=9999-12-31&from=0000-01-01&site=%00&evaluation=%00&page=1e99`, undefined, null);
            await expectNoServerError(res, `${method} ${url} with a hostile query`);
            break;
          }
          const res = await send(method, url, body, probe.contentType);
          await expectNoServerError(res, `${method} ${url} with ${probe.what}`);
          if (route.readsJson) {
            if (probe.what === "text/plain" || probe.what === "a form" || probe.what === "no content type") expect(res.status, probe.what).toBe(415);
            if (probe.what === "a 2 MB body") expect(res.status).toBe(413);
            if (probe.what === "NUL in every text field") expect(res.status).toBe(422);
            // 10 kB of brackets: too large where the route reads only a few kB, else too deep.
            if (probe.what === "JSON nested 5000 deep") expect(res.status).toBe(deepBody.length > route.maxJsonBytes ? 413 : 422);
            if (probe.what === "malformed JSON" || probe.what === "invalid UTF-8") expect(res.status).toBe(400);
          }
        }
      }, 120_000);

      it(`${method} ${route.url}: a NUL or line break in a path parameter is refused, not stored`, async () => {
        if (!route.url.includes("[")) return;
        const url = route.url.replace(/\[[^\]]+\]/g, "a%00b");
        const res = await send(method, url, method === "GET" || method === "DELETE" ? undefined : "{}", method === "GET" || method === "DELETE" ? null : "application/json");
        await expectNoServerError(res, `${method} ${url}`);
        expect(res.status).toBe(422);
      });
    }

    it(`${route.url}: methods it does not export answer 405 in JSON with Allow`, async () => {
      for (const method of ["GET", "POST", "PUT", "PATCH", "DELETE"].filter((m) => !route.methods.includes(m))) {
        const res = await send(method, fill(route.url, method), method === "GET" ? undefined : "{}", method === "GET" ? null : "application/json");
        expect(res.status, `${method} ${route.url}`).toBe(405);
        const body = (await res.json()) as { error: { code: string; message: string } };
        expect(body.error.code).toBe("method_not_allowed");
        for (const m of route.methods) expect(res.headers.get("allow") ?? "").toContain(m);
      }
    });
  }
});

describe("specific answers", () => {
  it("a NUL in a site's name is a 422 naming the field, and nothing is stored", async () => {
    const res = await admin.request("POST", "/api/sites", { name: "Plant\u00001", nominalVoltageV: 230, frequencyHz: 50 });
    expect(res.status).toBe(422);
    const body = (await res.json()) as { error: { fieldErrors: Record<string, string[]> } };
    expect(body.error.fieldErrors.name?.[0]).toMatch(/control character \(U\+0000\)/);
  });

  it("a tab or line break in a one-line field is refused; a multi-line field keeps them", async () => {
    const tab = await admin.request("POST", "/api/sites", { name: "Plant\tA", nominalVoltageV: 230, frequencyHz: 50 });
    expect(tab.status).toBe(422);
    expect(((await tab.json()) as { error: { fieldErrors: Record<string, string[]> } }).error.fieldErrors.name?.[0]).toMatch(/single line/);
    const notes = await admin.request("POST", "/api/sites", { name: `Multi-line ${Date.now()}`, nominalVoltageV: 230, frequencyHz: 50, notes: "line one\n\tline two" });
    expect(notes.status).toBe(201);
  });

  it("an escape character in a review comment is refused with 422 naming the field", async () => {
    const res = await admin.request("POST", `/api/captures/${captureId}/review`, { action: "comment", comment: "see \u001b[31m" });
    expect(res.status).toBe(422);
    expect(((await res.json()) as { error: { fieldErrors: Record<string, string[]> } }).error.fieldErrors.comment?.[0]).toMatch(/control character \(U\+001B\)/);
  });

  it("dates outside 1970–2100 in the capture list are a 422, not a 500", async () => {
    for (const q of ["to=9999-12-31", "from=0001-01-01", "to=2101-01-01"]) {
      const res = await admin.request("GET", `/api/captures?${q}`);
      expect(res.status, q).toBe(422);
    }
    expect((await admin.request("GET", "/api/captures?from=2020-01-01&to=2100-12-31")).status).toBe(200);
  });

  it("an anonymous route refuses a 30 MB body with 413 before parsing or hashing anything", async () => {
    const res = await send("POST", "/api/invitations/accept", JSON.stringify({ token: "x".repeat(30 * 1024 * 1024) }), "application/json", new Client());
    expect(res.status).toBe(413);
  });
});

describe("same-origin check compares scheme, host and port with APP_URL", () => {
  const site = () => ({ name: `Origin probe ${Date.now()}`, nominalVoltageV: 230, frequencyHz: 50 });
  const app = () => new URL(appUrl());

  it("accepts the app's own origin", async () => {
    expect((await admin.request("POST", "/api/sites", site())).status).toBe(201);
  });

  it("refuses https:// when the app is served on http://", async () => {
    const origin = `https://${app().host}`;
    expect((await admin.request("POST", "/api/sites", site(), { origin })).status).toBe(403);
  });

  it("refuses another port on the same host", async () => {
    const origin = `${app().protocol}//${app().hostname}:${Number(app().port) + 1}`;
    expect((await admin.request("POST", "/api/sites", site(), { origin })).status).toBe(403);
  });

  it("refuses a foreign Origin even when X-Forwarded-Host claims the same host", async () => {
    const res = await admin.request("POST", "/api/sites", site(), { origin: "http://evil.example", "x-forwarded-host": "evil.example" });
    expect(res.status).toBe(403);
  });

  it("refuses a write with no Origin at all", async () => {
    const res = await fetch(new URL("/api/sites", appUrl()), {
      method: "POST",
      headers: { "content-type": "application/json", cookie: admin.cookie! },
      body: JSON.stringify(site()),
    });
    expect(res.status).toBe(403);
  });
});
