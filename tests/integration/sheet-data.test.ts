// The sheet's data paths: chart data precomputed with the evaluation and served as stored, with a long cache
// when keyed by its id and the id as its ETag; the headline numbers read from the analysis summary stored with
// the analysis (or built in PostgreSQL for analyses stored before it); the page carries the shown channel only.
import { desc, eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { analyses, evaluationSheetParts, evaluations } from "@/db/schema";
import { demoCaptureId, listedCapture } from "../support/captures";
import { Client, signedIn } from "../support/http";

let engineer: Client;
let captureId = "";
let evaluationId = "";

beforeAll(async () => {
  engineer = await signedIn("engineer");
  captureId = await demoCaptureId(engineer, "Compressor drives at full load — after filter");
  const { evaluations: list } = (await (await engineer.request("GET", `/api/captures/${captureId}/evaluations`)).json()) as { evaluations: { id: string }[] };
  evaluationId = list[0]!.id;
});

describe("chart data", () => {
  it("is stored with the evaluation when the analysis is stored", async () => {
    const [row] = await db.select({ charts: evaluations.charts }).from(evaluations).where(eq(evaluations.id, evaluationId));
    // Every channel of the record, in the file's column order (fixtures/demo/quillbrook-drives-after-filter.csv).
    expect(row?.charts?.channels.map((c) => c.name)).toEqual(["Va (V)", "Vb (V)", "Vc (V)", "Ia (A)", "Ib (A)", "Ic (A)"]);
  });

  it("keyed by the evaluation id it may be cached for a year; without it, it is revalidated", async () => {
    const keyed = await engineer.request("GET", `/api/captures/${captureId}/charts?evaluation=${evaluationId}`);
    expect(keyed.status).toBe(200);
    expect(keyed.headers.get("cache-control")).toBe("private, max-age=31536000, immutable");
    const body = (await keyed.json()) as { evaluationId: string; channels: { harmonics: unknown[] }[] };
    expect(body.evaluationId).toBe(evaluationId);
    expect(body.channels[0]!.harmonics.length).toBeGreaterThan(0);
    const latest = await engineer.request("GET", `/api/captures/${captureId}/charts`);
    expect(latest.headers.get("cache-control")).toBe("private, no-cache");
  });

  it("carries the evaluation's id as its ETag; a client holding it gets 304, once signed in and allowed", async () => {
    const url = `/api/captures/${captureId}/charts?evaluation=${evaluationId}`;
    const first = await engineer.request("GET", url);
    expect(first.headers.get("etag")).toBe(`"${evaluationId}"`);
    expect(first.headers.get("content-type")).toMatch(/^application\/json/);
    const held = await engineer.request("GET", url, undefined, { "if-none-match": `"${evaluationId}"` });
    expect(held.status).toBe(304);
    expect(await held.text()).toBe("");
    const otherTag = await engineer.request("GET", url, undefined, { "if-none-match": '"00000000-0000-4000-8000-000000000000"' });
    expect(otherTag.status).toBe(200);
    // The tag is no key: without a session the answer is still 401.
    expect((await new Client().request("GET", url, undefined, { "if-none-match": `"${evaluationId}"` })).status).toBe(401);
  });

  it("an evaluation of another capture, or a malformed id, is refused", async () => {
    expect((await engineer.request("GET", `/api/captures/${captureId}/charts?evaluation=00000000-0000-4000-8000-000000000000`)).status).toBe(404);
    expect((await engineer.request("GET", `/api/captures/${captureId}/charts?evaluation=nope`)).status).toBe(422);
  });

  it("an older evaluation without stored chart data gets it built once and saved", async () => {
    // An evaluation as stored before chart data was precomputed: a copy of this one without it.
    const [stored] = await db.select().from(evaluations).where(eq(evaluations.id, evaluationId));
    const { id: _id, createdAt: _createdAt, charts: _charts, ...rest } = stored!;
    const [older] = await db.insert(evaluations).values({ ...rest, charts: null }).returning({ id: evaluations.id });
    const res = await engineer.request("GET", `/api/captures/${captureId}/charts?evaluation=${older!.id}`);
    expect(res.status).toBe(200);
    const [row] = await db.select({ charts: evaluations.charts }).from(evaluations).where(eq(evaluations.id, older!.id));
    expect(row?.charts).not.toBeNull();
    // Once filled, the cache is as immutable as the rest of the evaluation.
    await expect(db.update(evaluations).set({ charts: null }).where(eq(evaluations.id, older!.id))).rejects.toThrow();
    const body = (await res.json()) as { evaluationId: string; channels: { name: string }[] };
    expect(body.evaluationId).toBe(older!.id);
    expect(body.channels.map((c) => c.name)).toEqual(stored!.charts!.channels.map((c) => c.name));
  });

  it("is the stored chart data as it is, with the evaluation's own id in front", async () => {
    // A second evaluation holding the same chart data: its answer differs from the first one's only in the id.
    const [stored] = await db.select().from(evaluations).where(eq(evaluations.id, evaluationId));
    const { id: _id, createdAt: _createdAt, ...rest } = stored!;
    const [copy] = await db.insert(evaluations).values(rest).returning({ id: evaluations.id });
    const body = (await (await engineer.request("GET", `/api/captures/${captureId}/charts?evaluation=${copy!.id}`)).json()) as Record<string, unknown>;
    expect(body).toEqual({ evaluationId: copy!.id, ...stored!.charts });
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

describe("the sheet page", () => {
  it("renders the channel named in ?channel= (the first, worst one without it)", async () => {
    const [stored] = await db.select({ result: evaluations.result }).from(evaluations).where(eq(evaluations.id, evaluationId));
    const names = stored!.result.channels.map((c) => c.channel);
    expect(names.length).toBeGreaterThan(1);
    const heading = async (query: string) => {
      const html = (await (await engineer.request("GET", `/captures/${captureId}?evaluation=${evaluationId}${query}`)).text()).replace(/<!-- -->/g, "");
      return /Per-order sheet · ([^<]+?)\s*<span/.exec(html)?.[1];
    };
    expect(await heading("")).toBe(names[0]);
    expect(await heading(`&channel=${encodeURIComponent(names[1]!)}`)).toBe(names[1]);
    expect(await heading("&channel=nothing-like-it")).toBe(names[0]);
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
