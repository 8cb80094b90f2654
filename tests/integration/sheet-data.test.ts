// The sheet's data paths: chart data precomputed (and gzipped) with the evaluation and served as stored, with a
// long cache when keyed by its id and the id as its ETag; the headline numbers read from the analysis summary stored with
// the analysis (or built in PostgreSQL for analyses stored before it); the page carries the shown channel only.
import http from "node:http";
import { gunzipSync } from "node:zlib";
import { desc, eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { analyses, evaluationSheetBodies, evaluationSheetParts, evaluations } from "@/db/schema";
import { demoCaptureId, listedCapture } from "../support/captures";
import { appUrl } from "../support/env";
import { Client, signedIn } from "../support/http";

let engineer: Client;
let captureId = "";
let evaluationId = "";

/** A GET as the bytes on the wire (fetch would unzip them), with the client's session. */
function rawGet(client: Client, path: string, headers: Record<string, string>): Promise<{ status: number; headers: http.IncomingHttpHeaders; body: Buffer }> {
  return new Promise((resolve, reject) => {
    http
      .get(new URL(path, appUrl()), { headers: { ...(client.cookie ? { cookie: client.cookie } : {}), ...headers } }, (res) => {
        const chunks: Buffer[] = [];
        res.on("data", (c: Buffer) => chunks.push(c));
        res.on("end", () => resolve({ status: res.statusCode ?? 0, headers: res.headers, body: Buffer.concat(chunks) }));
        res.on("error", reject);
      })
      .on("error", reject);
  });
}

beforeAll(async () => {
  engineer = await signedIn("engineer");
  captureId = await demoCaptureId(engineer, "Compressor drives at full load — after filter");
  const { evaluations: list } = (await (await engineer.request("GET", `/api/captures/${captureId}/evaluations`)).json()) as { evaluations: { id: string }[] };
  evaluationId = list[0]!.id;
});

describe("chart data", () => {
  it("is stored with the evaluation when the analysis is stored, as JSON and gzipped", async () => {
    const [row] = await db.select({ charts: evaluations.charts, chartsGzip: evaluations.chartsGzip }).from(evaluations).where(eq(evaluations.id, evaluationId));
    // Every channel of the record, in the file's column order (fixtures/demo/quillbrook-drives-after-filter.csv).
    expect(row?.charts?.channels.map((c) => c.name)).toEqual(["Va (V)", "Vb (V)", "Vc (V)", "Ia (A)", "Ib (A)", "Ic (A)"]);
    // Unzipped with Node's zlib (RFC 1952 gzip), the bytes are the same document.
    expect(JSON.parse(gunzipSync(row!.chartsGzip!).toString("utf8"))).toEqual(row!.charts);
  });

  it("goes out as the stored gzipped bytes to a client that accepts gzip, and unzipped to one that does not", async () => {
    const url = `/api/captures/${captureId}/charts?evaluation=${evaluationId}`;
    const [row] = await db.select({ charts: evaluations.charts, chartsGzip: evaluations.chartsGzip }).from(evaluations).where(eq(evaluations.id, evaluationId));
    const zipped = await rawGet(engineer, url, { "accept-encoding": "gzip, deflate, br" });
    expect(zipped.status).toBe(200);
    expect(zipped.headers["content-encoding"]).toBe("gzip");
    expect(zipped.headers["vary"]).toMatch(/accept-encoding/i);
    expect(zipped.body.equals(row!.chartsGzip!)).toBe(true);
    const plain = await rawGet(engineer, url, { "accept-encoding": "identity" });
    expect(plain.status).toBe(200);
    expect(plain.headers["content-encoding"]).toBeUndefined();
    expect(JSON.parse(plain.body.toString("utf8"))).toEqual(row!.charts);
    // Two encodings, two strong validators: a tag of one never answers for the other with 304.
    expect(plain.headers.etag).toBe(`"${evaluationId}"`);
    expect(zipped.headers.etag).toBe(`"${evaluationId}-gzip"`);
    expect((await rawGet(engineer, url, { "accept-encoding": "identity", "if-none-match": `"${evaluationId}-gzip"` })).status).toBe(200);
  });

  it("keyed by the evaluation id it may be cached for a year; without it, it is revalidated", async () => {
    const keyed = await engineer.request("GET", `/api/captures/${captureId}/charts?evaluation=${evaluationId}`);
    expect(keyed.status).toBe(200);
    expect(keyed.headers.get("cache-control")).toBe("private, max-age=31536000, immutable");
    const body = (await keyed.json()) as { channels: { harmonics: unknown[] }[] };
    expect(body.channels[0]!.harmonics.length).toBeGreaterThan(0);
    const latest = await engineer.request("GET", `/api/captures/${captureId}/charts`);
    expect(latest.headers.get("cache-control")).toBe("private, no-cache");
  });

  it("carries the evaluation's id as its ETag; a client holding it gets 304, once signed in and allowed", async () => {
    const url = `/api/captures/${captureId}/charts?evaluation=${evaluationId}`;
    const gzip = { "accept-encoding": "gzip" };
    const first = await engineer.request("GET", url, undefined, gzip);
    expect(first.headers.get("etag")).toBe(`"${evaluationId}-gzip"`);
    expect(first.headers.get("content-type")).toMatch(/^application\/json/);
    const held = await engineer.request("GET", url, undefined, { ...gzip, "if-none-match": `"${evaluationId}-gzip"` });
    expect(held.status).toBe(304);
    expect(await held.text()).toBe("");
    const otherTag = await engineer.request("GET", url, undefined, { ...gzip, "if-none-match": '"00000000-0000-4000-8000-000000000000-gzip"' });
    expect(otherTag.status).toBe(200);
    // The tag is no key: without a session the answer is still 401.
    expect((await new Client().request("GET", url, undefined, { ...gzip, "if-none-match": `"${evaluationId}-gzip"` })).status).toBe(401);
  });

  it("an evaluation of another capture, or a malformed id, is refused", async () => {
    expect((await engineer.request("GET", `/api/captures/${captureId}/charts?evaluation=00000000-0000-4000-8000-000000000000`)).status).toBe(404);
    expect((await engineer.request("GET", `/api/captures/${captureId}/charts?evaluation=nope`)).status).toBe(422);
  });

  it("an older evaluation without stored chart data gets it built once and saved", async () => {
    // An evaluation as stored before chart data was precomputed: a copy of this one without it.
    const [stored] = await db.select().from(evaluations).where(eq(evaluations.id, evaluationId));
    const { id: _id, createdAt: _createdAt, charts: _charts, ...rest } = stored!;
    const [older] = await db.insert(evaluations).values({ ...rest, charts: null, chartsGzip: null }).returning({ id: evaluations.id });
    const res = await engineer.request("GET", `/api/captures/${captureId}/charts?evaluation=${older!.id}`);
    expect(res.status).toBe(200);
    const [row] = await db.select({ charts: evaluations.charts, chartsGzip: evaluations.chartsGzip }).from(evaluations).where(eq(evaluations.id, older!.id));
    expect(row?.charts).not.toBeNull();
    expect(JSON.parse(gunzipSync(row!.chartsGzip!).toString("utf8"))).toEqual(row!.charts);
    // Once filled, the cache is as immutable as the rest of the evaluation.
    await expect(db.update(evaluations).set({ charts: null }).where(eq(evaluations.id, older!.id))).rejects.toThrow();
    await expect(db.update(evaluations).set({ chartsGzip: Buffer.from("other") }).where(eq(evaluations.id, older!.id))).rejects.toThrow();
    const body = (await res.json()) as { channels: { name: string }[] };
    expect(body.channels.map((c) => c.name)).toEqual(stored!.charts!.channels.map((c) => c.name));
  });

  it("an older evaluation with chart data but not yet gzipped gets the gzipped form once, of the same document", async () => {
    const [stored] = await db.select().from(evaluations).where(eq(evaluations.id, evaluationId));
    const { id: _id, createdAt: _createdAt, ...rest } = stored!;
    const [older] = await db.insert(evaluations).values({ ...rest, chartsGzip: null }).returning({ id: evaluations.id });
    const res = await engineer.request("GET", `/api/captures/${captureId}/charts?evaluation=${older!.id}`, undefined, { "accept-encoding": "gzip" });
    expect(res.status).toBe(200);
    expect(await res.json()).toEqual(stored!.charts);
    const [row] = await db.select({ chartsGzip: evaluations.chartsGzip }).from(evaluations).where(eq(evaluations.id, older!.id));
    expect(JSON.parse(gunzipSync(row!.chartsGzip!).toString("utf8"))).toEqual(stored!.charts);
    // The rest of the evaluation still cannot change.
    await expect(db.update(evaluations).set({ verdict: "tampered" }).where(eq(evaluations.id, older!.id))).rejects.toThrow();
  });
});

describe("the sheet page's parts", () => {
  it("an evaluation stored before them gets its head and channels split from the whole result on its first view, never changed", async () => {
    const [stored] = await db.select().from(evaluations).where(eq(evaluations.id, evaluationId));
    const { id: _id, createdAt: _createdAt, ...rest } = stored!;
    const [copy] = await db.insert(evaluations).values(rest).returning({ id: evaluations.id });
    const page = await engineer.request("GET", `/captures/${captureId}?evaluation=${copy!.id}`);
    expect(page.status).toBe(200);
    const parts = await db.select().from(evaluationSheetParts).where(eq(evaluationSheetParts.evaluationId, copy!.id)).orderBy(evaluationSheetParts.part);
    expect(parts.map((p) => p.channel)).toEqual([null, ...stored!.result.channels.map((c) => c.channel)]);
    await expect(db.update(evaluationSheetParts).set({ channel: "other" }).where(eq(evaluationSheetParts.evaluationId, copy!.id))).rejects.toThrow();
  });
});

describe("the analysis summary", () => {
  it("is stored with the analysis: the whole result's scalars without its per-order and per-window arrays", async () => {
    const [a] = await db.select({ result: analyses.result, summary: analyses.summary }).from(analyses).where(eq(analyses.captureId, captureId)).orderBy(desc(analyses.createdAt)).limit(1);
    expect(a?.result.channels[0]?.harmonics.length).toBeGreaterThan(0);
    expect(a?.summary?.channels.map((c) => [c.name, c.rms, c.thdPercent])).toEqual(a?.result.channels.map((c) => [c.name, c.rms, c.thdPercent]));
    expect(a?.summary?.channels.some((c) => "harmonics" in c || "series" in c || "harmonicSeries" in c || "groups" in c)).toBe(false);
    expect(a?.summary?.sequence.some((s) => "orders" in s)).toBe(false);
  });

  it("an analysis stored without one gets the same headline numbers, built in PostgreSQL", async () => {
    const [stored] = await db.select().from(evaluations).where(eq(evaluations.id, evaluationId));
    const [analysis] = await db.select().from(analyses).where(eq(analyses.id, stored!.analysisId));
    const { id: _aid, createdAt: _acreated, summary: _summary, ...analysisRest } = analysis!;
    const [older] = await db.insert(analyses).values({ ...analysisRest, summary: null }).returning({ id: analyses.id });
    const { id: _eid, createdAt: _ecreated, ...evaluationRest } = stored!;
    const [copy] = await db.insert(evaluations).values({ ...evaluationRest, analysisId: older!.id }).returning({ id: evaluations.id });
    const headline = async (id: string) =>
      (await (await engineer.request("GET", `/api/captures/${captureId}/sheet-csv?evaluation=${id}`)).text()).split("\r\n").filter((l) => l.startsWith("Headline numbers") || l.startsWith("Three-phase total"));
    const expected = await headline(evaluationId);
    expect(expected.length).toBeGreaterThan(2);
    expect(await headline(copy!.id)).toEqual(expected);
  });
});

describe("the capture JSON", () => {
  it("answers the capture's state and progress, not its set-up or storage key", async () => {
    const res = await engineer.request("GET", `/api/captures/${captureId}`);
    const { capture } = (await res.json()) as { capture: Record<string, unknown> };
    expect(capture.id).toBe(captureId);
    expect(capture.status).toBe("done");
    expect(capture.progressPercent).toBe(100);
    for (const internal of ["s3Key", "mapping", "context", "sha256"]) expect(capture).not.toHaveProperty(internal);
  });
});

describe("the sheet page and its body", () => {
  type Body = { body: { channels: { channel: string }[]; channel: { channel: string; rows: { order: number }[] } } | null };
  const bodyUrl = (query = "") => `/api/captures/${captureId}/sheet-body?evaluation=${evaluationId}${query}`;

  it("the page names the body it loads, with the channel in ?channel=; the per-order rows are not in the page", async () => {
    const names = ((await (await engineer.request("GET", bodyUrl())).json()) as Body).body!.channels.map((c) => c.channel);
    expect(names.length).toBeGreaterThan(1);
    const html = await (await engineer.request("GET", `/captures/${captureId}?channel=${encodeURIComponent(names[1]!)}`)).text();
    const escape = (t: string) => t.replace(/[.*+?^${}()|[\]\\]/g, "\\$&");
    // (In the page's data the "&" may be escaped.)
    expect(html).toMatch(new RegExp(`sheet-body\\?evaluation=[0-9a-f-]{36}[^"]{1,8}channel=${escape(encodeURIComponent(names[1]!))}`));
    expect(html).not.toContain('data-testid="order-table"');
  });

  it("the body is the channel named in ?channel= (the first, worst one without it or for an unknown name), cached for a year", async () => {
    const [stored] = await db.select({ result: evaluations.result }).from(evaluations).where(eq(evaluations.id, evaluationId));
    const names = stored!.result.channels.map((c) => c.channel);
    const shown = async (query: string) => {
      const res = await engineer.request("GET", bodyUrl(query));
      expect(res.status).toBe(200);
      expect(res.headers.get("cache-control")).toBe("private, max-age=31536000, immutable");
      const { body } = (await res.json()) as Body;
      expect(body!.channels.map((c) => c.channel)).toEqual(names);
      return body!.channel;
    };
    expect((await shown("")).channel).toBe(names[0]);
    const second = await shown(`&channel=${encodeURIComponent(names[1]!)}`);
    expect(second.channel).toBe(names[1]);
    expect(second.rows.map((r) => r.order)).toEqual(stored!.result.channels[1]!.rows.map((r) => r.order));
    expect((await shown("&channel=nothing-like-it")).channel).toBe(names[0]);
  });

  it("the body goes out as stored with the evaluation, gzipped, with the evaluation and channel part as its ETag", async () => {
    const stored = await db.select().from(evaluationSheetBodies).where(eq(evaluationSheetBodies.evaluationId, evaluationId)).orderBy(evaluationSheetBodies.part);
    const [head] = await db.select({ data: evaluationSheetParts.data }).from(evaluationSheetParts).where(eq(evaluationSheetParts.evaluationId, evaluationId)).orderBy(evaluationSheetParts.part).limit(1);
    const names = (head!.data as { channels: { channel: string }[] }).channels.map((c) => c.channel);
    expect(stored.map((b) => b.part)).toEqual(names.map((_, i) => i + 1));
    const second = await rawGet(engineer, bodyUrl(`&channel=${encodeURIComponent(names[1]!)}`), { "accept-encoding": "gzip" });
    expect(second.headers["content-encoding"]).toBe("gzip");
    expect(second.body.equals(stored[1]!.gzip)).toBe(true);
    expect(second.headers.etag).toBe(`"${evaluationId}.2-gzip"`);
    expect((JSON.parse(gunzipSync(second.body).toString("utf8")) as Body).body!.channel.channel).toBe(names[1]);
    expect((await rawGet(engineer, bodyUrl(`&channel=${encodeURIComponent(names[1]!)}`), { "accept-encoding": "gzip", "if-none-match": `"${evaluationId}.2-gzip"` })).status).toBe(304);
    // Another channel's tag is another body.
    expect((await rawGet(engineer, bodyUrl(), { "accept-encoding": "gzip", "if-none-match": `"${evaluationId}.2-gzip"` })).status).toBe(200);
    await expect(db.update(evaluationSheetBodies).set({ gzip: Buffer.from("other") }).where(eq(evaluationSheetBodies.evaluationId, evaluationId))).rejects.toThrow();
  });

  it("an evaluation stored before bodies were gets the shown one built and stored on its first read, the same as a new one's", async () => {
    const [stored] = await db.select().from(evaluations).where(eq(evaluations.id, evaluationId));
    const { id: _id, createdAt: _createdAt, ...rest } = stored!;
    const [copy] = await db.insert(evaluations).values(rest).returning({ id: evaluations.id });
    const res = await engineer.request("GET", `/api/captures/${captureId}/sheet-body?evaluation=${copy!.id}`);
    expect(res.status).toBe(200);
    const [own] = await db.select().from(evaluationSheetBodies).where(eq(evaluationSheetBodies.evaluationId, evaluationId)).orderBy(evaluationSheetBodies.part).limit(1);
    const built = await db.select().from(evaluationSheetBodies).where(eq(evaluationSheetBodies.evaluationId, copy!.id));
    expect(built.map((b) => b.part)).toContain(1);
    const first = built.find((b) => b.part === 1)!;
    expect(JSON.parse(gunzipSync(first.gzip).toString("utf8"))).toEqual(JSON.parse(gunzipSync(own!.gzip).toString("utf8")));
    expect(await res.json()).toEqual(JSON.parse(gunzipSync(own!.gzip).toString("utf8")));
  });

  it("the body wants an evaluation of this capture: none, a malformed one or another capture's is refused", async () => {
    expect((await engineer.request("GET", `/api/captures/${captureId}/sheet-body`)).status).toBe(422);
    expect((await engineer.request("GET", `/api/captures/${captureId}/sheet-body?evaluation=nope`)).status).toBe(422);
    expect((await engineer.request("GET", `/api/captures/${captureId}/sheet-body?evaluation=00000000-0000-4000-8000-000000000000`)).status).toBe(404);
    expect((await engineer.request("GET", bodyUrl("&channel=%00"))).status).toBe(422);
    expect((await new Client().request("GET", bodyUrl())).status).toBe(401);
  });
});

describe("headline numbers from the slim analysis summary", () => {
  it("the CSV of a three-phase demo capture carries currents, voltages, power with the total, and unbalance", async () => {
    const csv = await (await engineer.request("GET", `/api/captures/${captureId}/sheet-csv`)).text();
    const lines = csv.split("\r\n");
    expect(lines.some((l) => l.startsWith("Headline numbers: currents,Fundamental frequency (Hz),RMS (A)"))).toBe(true);
    expect(lines.some((l) => l.startsWith("Headline numbers: voltages,"))).toBe(true);
    expect(lines.some((l) => l.startsWith("Three-phase total,"))).toBe(true);
    expect(lines.some((l) => l.startsWith("Headline numbers: unbalance,"))).toBe(true);
  });
});

describe("captures list", () => {
  it("shows the approved verdict beside the latest when a later evaluation differs", async () => {
    const heater = await listedCapture<{ id: string; title: string; verdict: string; approvedVerdict: string | null }>(engineer, "Heater controller, 1.8 kW");
    // The demo approved it as a Class A pass.
    expect(heater.approvedVerdict).toBe("pass");
    expect(heater.verdict).toBe("pass");
    // Judged again as Class D at 100 W (limits 3.4 mA/W × 100 W = 0.34 A at h3, IEC 61000-3-2:2018+A1:2020 Table 3), it is no longer a pass.
    const again = await engineer.request("POST", `/api/captures/${heater.id}/evaluations`, {
      limitSetKey: "iec-61000-3-2-class-d",
      context: { ratedPowerW: 100, nominalVoltageV: 230, phaseConfig: "single-phase" },
    });
    expect(again.status).toBe(201);
    const row = await listedCapture<{ id: string; title: string; verdict: string; approvedVerdict: string | null; latestVerdict: string | null }>(engineer, "Heater controller, 1.8 kW");
    expect(row.approvedVerdict).toBe("pass");
    // The list's verdict stays the approved one (what customers see); the latest is beside it.
    expect(row.verdict).toBe("pass");
    expect(row.latestVerdict).not.toBe("pass");
    const { capture } = (await (await engineer.request("GET", `/api/captures/${heater.id}`)).json()) as { capture: { siteId: string } };
    const page = (await (await engineer.request("GET", `/captures?status=done&site=${capture.siteId}`)).text()).replace(/<!-- -->/g, "");
    expect(page).toContain("approved as Pass; latest differs");
  });
});
