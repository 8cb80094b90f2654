// Response headers on pages and routes, immutability of judged records, and the CSV export's formula
// neutralisation (issue 10 §5), against the running app and its PostgreSQL.
import http from "node:http";
import { gunzipSync } from "node:zlib";
import { eq, sql } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { evaluations, limitSetRevisions } from "@/db/schema";
import { appUrl } from "../support/env";
import { analysedCapture, demoCaptureId, json } from "../support/captures";
import { Client, signedIn } from "../support/http";

let engineer: Client;
let captureId = "";

beforeAll(async () => {
  engineer = await signedIn("engineer");
  // The demo's approved capture, found page by page (other tests add captures in front of it).
  captureId = await demoCaptureId(engineer, "Compressor drives at full load — after filter");
});

function expectCommonHeaders(res: Response, what: string) {
  expect(res.headers.get("x-content-type-options"), what).toBe("nosniff");
  expect(res.headers.get("referrer-policy"), what).toBe("same-origin");
  expect(res.headers.get("content-security-policy") ?? "", what).toContain("frame-ancestors 'none'");
}

/** The policy's directives as a map. */
const directives = (csp: string) => new Map(csp.split(";").map((d) => d.trim().split(/\s+/)).map(([k, ...v]) => [k!, v]));

describe("pages carry a nonce-based Content-Security-Policy", () => {
  const pages: Array<{ path: string; signedIn: boolean }> = [
    { path: "/sign-in", signedIn: false },
    { path: "/invite/not-a-real-token", signedIn: false },
    { path: "/share/not-a-real-token", signedIn: false },
    { path: "/no-such-page", signedIn: false },
    { path: "/captures", signedIn: true },
    { path: "/admin/users", signedIn: true },
  ];

  for (const p of pages) {
    it(`${p.path}: only scripts with this response's nonce may run, and nobody may frame it`, async () => {
      const client = p.signedIn ? await signedIn("admin") : new Client();
      const res = await client.request("GET", p.path);
      expectCommonHeaders(res, p.path);
      const csp = directives(res.headers.get("content-security-policy")!);
      const scriptSrc = csp.get("script-src")!;
      expect(scriptSrc).not.toContain("'unsafe-inline'");
      expect(scriptSrc).not.toContain("'unsafe-eval'");
      expect(scriptSrc.some((s) => s.startsWith("http") || s === "*")).toBe(false);
      const nonce = /'nonce-([^']+)'/.exec(scriptSrc.join(" "))?.[1];
      // 16 random bytes in base64 (scripts/serve.mjs): 24 characters.
      expect(nonce).toMatch(/^[A-Za-z0-9+/]{22}==$/);
      expect(csp.get("object-src")).toEqual(["'none'"]);
      // Every script element of the page carries the nonce (else the browser would refuse it).
      const html = await res.text();
      const scripts = [...html.matchAll(/<script\b[^>]*>/g)].map((m) => m[0]);
      expect(scripts.length).toBeGreaterThan(0);
      for (const tag of scripts) expect(tag).toContain(`nonce="${nonce}"`);
    });
  }

  it("the nonce is new on every response", async () => {
    const a = (await new Client().request("GET", "/sign-in")).headers.get("content-security-policy");
    const b = (await new Client().request("GET", "/sign-in")).headers.get("content-security-policy");
    expect(a).not.toBe(b);
  });

  it("every page names the favicon from public/, and it is served as an SVG", async () => {
    const html = await (await new Client().request("GET", "/sign-in")).text();
    expect(html).toContain('<link rel="icon" href="/favicon.svg" type="image/svg+xml"/>');
    const res = await fetch(new URL("/favicon.svg", appUrl()));
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toContain("image/svg+xml");
    expect(await res.text()).toContain("<svg");
  });

  it("built scripts and styles are served with nosniff", async () => {
    const html = await (await new Client().request("GET", "/sign-in")).text();
    const asset = /(\/_next\/static\/[^"]+\.js)/.exec(html)![1]!;
    const res = await fetch(new URL(asset, appUrl()));
    expect(res.status).toBe(200);
    expect(res.headers.get("x-content-type-options")).toBe("nosniff");
  });
});

describe("API responses carry the headers too", () => {
  const cases: Array<{ path: string; who: "engineer" | "anonymous"; status: number }> = [
    { path: "/api/sites", who: "engineer", status: 200 },
    { path: "/api/sites", who: "anonymous", status: 401 },
    { path: "/api/captures/:capture/sheet-csv", who: "engineer", status: 200 },
    { path: "/api/shared/not-a-real-token/charts", who: "anonymous", status: 404 },
  ];
  for (const c of cases) {
    it(`${c.path} as ${c.who} (${c.status})`, async () => {
      const client = c.who === "anonymous" ? new Client() : engineer;
      const res = await client.request("GET", c.path.replace(":capture", captureId));
      expect(res.status).toBe(c.status);
      expectCommonHeaders(res, c.path);
      expect(res.headers.get("content-security-policy")).toContain("default-src 'none'");
    });
  }
});

/** A GET through node:http, which (unlike fetch) hands back the body as sent. */
function rawGet(path: string, headers: Record<string, string>): Promise<{ status: number; headers: http.IncomingHttpHeaders; body: Buffer }> {
  return new Promise((resolve, reject) => {
    http
      .get(new URL(path, appUrl()), { headers }, (res) => {
        const chunks: Buffer[] = [];
        res.on("data", (c: Buffer) => chunks.push(c));
        res.on("end", () => resolve({ status: res.statusCode ?? 0, headers: res.headers, body: Buffer.concat(chunks) }));
        res.on("error", reject);
      })
      .on("error", reject);
  });
}

describe("compression (scripts/serve.mjs)", () => {
  it("pages and API answers are gzip-compressed for a client that accepts it, and sent as they are to one that does not", async () => {
    for (const path of [`/captures/${captureId}`, `/api/captures/${captureId}/charts`]) {
      const zipped = await rawGet(path, { cookie: engineer.cookie!, "accept-encoding": "gzip, deflate, br" });
      expect(zipped.status, path).toBe(200);
      expect(zipped.headers["content-encoding"], path).toBe("gzip");
      expect(zipped.headers.vary ?? "", path).toMatch(/accept-encoding/i);
      const plain = await rawGet(path, { cookie: engineer.cookie! });
      expect(plain.headers["content-encoding"], path).toBeUndefined();
      const text = gunzipSync(zipped.body).toString("utf8");
      // The same answer either way (a page differs only by its script nonce).
      if (path.startsWith("/api/")) expect(JSON.parse(text)).toEqual(JSON.parse(plain.body.toString("utf8")));
      else for (const html of [text, plain.body.toString("utf8")]) expect(html).toContain('data-testid="sheet-title"');
      expect(zipped.body.length).toBeLessThan(plain.body.length / 2);
    }
  });

  it("a small API answer (under 1 kB) goes out whole with its length, not compressed", async () => {
    const res = await rawGet(`/api/captures/${captureId}`, { cookie: engineer.cookie!, "accept-encoding": "gzip, deflate, br" });
    expect(res.status).toBe(200);
    expect(res.headers["content-encoding"]).toBeUndefined();
    expect(res.body.length).toBeLessThan(1024);
    expect(Number(res.headers["content-length"])).toBe(res.body.length);
    expect(((JSON.parse(res.body.toString("utf8")) as { capture: { id: string } }).capture.id)).toBe(captureId);
  });
});

/** Resolves to the database's own message for a refused statement (drizzle wraps it as the cause). */
async function refusal(query: PromiseLike<unknown>): Promise<string> {
  try {
    await query;
  } catch (err) {
    const e = err as { message?: string; cause?: { message?: string } };
    return e.cause?.message ?? e.message ?? String(err);
  }
  return "the statement succeeded";
}

describe("judged records cannot be changed in the database", () => {
  it("refuses DELETE of a stored limit-set revision (and UPDATE, as before)", async () => {
    const [rev] = await db.select({ id: limitSetRevisions.id }).from(limitSetRevisions).limit(1);
    expect(await refusal(db.delete(limitSetRevisions).where(eq(limitSetRevisions.id, rev!.id)))).toMatch(/DELETE of limit_set_revisions refused/);
    expect(await refusal(db.update(limitSetRevisions).set({ reason: "tampered" }).where(eq(limitSetRevisions.id, rev!.id)))).toMatch(/immutable/);
    expect(await db.select().from(limitSetRevisions).where(eq(limitSetRevisions.id, rev!.id))).toHaveLength(1);
  });

  it("refuses UPDATE and DELETE of a stored evaluation, so an approved fail cannot become a pass", async () => {
    const [ev] = await db.select().from(evaluations).where(eq(evaluations.captureId, captureId)).limit(1);
    expect(await refusal(db.update(evaluations).set({ verdict: "pass" }).where(eq(evaluations.id, ev!.id)))).toMatch(/UPDATE of evaluations refused/);
    expect(await refusal(db.delete(evaluations).where(eq(evaluations.id, ev!.id)))).toMatch(/DELETE of evaluations refused/);
    expect(await refusal(db.execute(sql`truncate evaluations cascade`))).toMatch(/TRUNCATE of evaluations refused/);
    const [after] = await db.select().from(evaluations).where(eq(evaluations.id, ev!.id));
    expect(after?.verdict).toBe(ev!.verdict);
  });

  it("judging again still works: it inserts a new evaluation", async () => {
    const res = await engineer.request("POST", `/api/captures/${captureId}/evaluations`, { limitSetKey: "iec-61000-3-2-class-a", context: {} });
    expect(res.status).toBe(201);
    const { evaluationId } = (await res.json()) as { evaluationId: string };
    expect(await db.select({ id: evaluations.id }).from(evaluations).where(eq(evaluations.id, evaluationId))).toHaveLength(1);
  });
});

describe("sheet CSV through the app", () => {
  it("a capture titled as a formula is exported as text; negative margins stay numbers", async () => {
    const sites = await json<{ sites: { id: string }[] }>(await engineer.request("GET", "/api/sites"));
    const technician = await signedIn("technician");
    const lines = ["Time (s),I (A)"];
    // 20 cycles of 50 Hz, 10 A fundamental plus 3 A third harmonic (fails IEC 61000-3-2:2018+A1:2020 Class A h3 2.30 A, Table 1).
    for (let k = 0; k < 20 * 256; k++) {
      const t = k / (256 * 50);
      lines.push(`${t.toFixed(7)},${(Math.SQRT2 * (10 * Math.sin(2 * Math.PI * 50 * t) + 3 * Math.sin(2 * Math.PI * 150 * t))).toFixed(4)}`);
    }
    const title = `=HYPERLINK("http://evil.example","open") ${Date.now()}`;
    const id = await analysedCapture(technician, sites.sites[0]!.id, title, lines.join("\n") + "\n");
    const csv = await (await engineer.request("GET", `/api/captures/${id}/sheet-csv`)).text();
    expect(csv).toContain(`Capture,"'=HYPERLINK(""http://evil.example"",""open"")`);
    expect(csv).not.toMatch(/(^|,)=HYPERLINK/m);
    const h3 = csv.split("\r\n").find((l) => /^I \(A\),3,/.test(l))!;
    const margin = h3.split(",")[6]!;
    expect(margin).toMatch(/^-\d/); // a fail has a negative margin, written as a plain number
    expect(Number(margin)).toBeLessThan(0);
  }, 90_000);
});
