import { readFileSync } from "node:fs";
import { eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db, sql } from "@/db/client";
import { analyses, captures, evaluations, limitSetRevisions, limitSets } from "@/db/schema";
import { getObjectBytes } from "@/lib/storage/s3";
import { finishedCapture, uploadCapture, type FinishedCapture } from "../support/captures";
import { Client, signedIn } from "../support/http";

let tech: Client;
let engineer: Client;
let siteId: string;

beforeAll(async () => {
  tech = await signedIn("technician");
  engineer = await signedIn("engineer");
  const sites = (await (await tech.request("GET", "/api/sites")).json()) as { sites: { id: string; name: string }[] };
  siteId = sites.sites.find((s) => s.name.startsWith("Bench B"))!.id;
});

const upload = (file: string, title: string) => uploadCapture(tech, { siteId, title, body: readFileSync(file), filename: file.split("/").pop() });

async function analyse(id: string, limitSetKey = "iec-61000-3-2-class-a"): Promise<FinishedCapture> {
  expect((await tech.request("PUT", `/api/captures/${id}/setup`, { mapping: { channels: {} }, limitSetKey, context: { nominalVoltageV: 230 } })).status).toBe(200);
  expect((await tech.request("POST", `/api/captures/${id}/analyze`)).status).toBe(202);
  return finishedCapture(tech, id, 30_000);
}

describe("capture workflow against PostgreSQL and s3rver", () => {
  it("uploads through the presigned URL, previews, analyses and pins the evaluation to the current revision", async () => {
    const file = "fixtures/single-phase-50hz.csv";
    const id = await upload(file, `Integration single phase ${Date.now()}`);
    const confirmed = await tech.request("POST", `/api/captures/${id}/uploaded`);
    expect(confirmed.status).toBe(200);
    const preview = (await confirmed.json()) as { preview: { columns: { name: string; role: string; quantity: string | null }[] } };
    const channels = preview.preview.columns.filter((c) => c.role === "channel");
    expect(channels.map((c) => c.quantity)).toEqual(["voltage", "current"]);

    const done = await analyse(id);
    expect(done).toMatchObject({ status: "done", failureReason: null });

    const [stored] = await db.select().from(analyses).where(eq(analyses.captureId, id));
    // A channel keeps its header text as its name (the analysis JSON of the product design).
    expect(stored?.result.channels.map((c) => c.name)).toEqual(["V (V)", "I (A)"]);
    expect(stored?.result.nominalHz).toBe(50);
    const [evaluation] = await db.select().from(evaluations).where(eq(evaluations.captureId, id));
    const [current] = await db
      .select({ id: limitSetRevisions.id })
      .from(limitSets)
      .innerJoin(limitSetRevisions, eq(limitSetRevisions.id, limitSets.currentRevisionId))
      .where(eq(limitSets.key, "iec-61000-3-2-class-a"));
    expect(evaluation?.limitSetRevisionId).toBe(current!.id);
    // fixtures/generate.ts: the current's 3rd is 4.2 A peak = 2.970 A r.m.s. (analytic Fourier series of the
    // test signal) against the Class A limit 2.30 A (IEC 61000-3-2:2018+A1:2020 Table 1) → fail.
    const h3 = evaluation?.result.rows.find((r) => r.order === 3);
    expect(h3).toMatchObject({ limit: 2.3, verdict: "fail" });
    expect(h3!.measured!).toBeCloseTo(2.97, 2);

    // The original object is byte-identical to the file on disk.
    const [row] = await db.select().from(captures).where(eq(captures.id, id));
    expect(Buffer.from(await getObjectBytes(row!.s3Key)).equals(readFileSync(file))).toBe(true);

    // An engineer re-judges in another context: a second evaluation, the first one kept.
    const again = await engineer.request("POST", `/api/captures/${id}/evaluations`, { limitSetKey: "iec-61000-3-2-class-d", context: { ratedPowerW: 300 } });
    expect(again.status).toBe(201);
    const list = (await (await engineer.request("GET", `/api/captures/${id}/evaluations`)).json()) as { evaluations: { limitSetKey: string }[] };
    expect(list.evaluations.map((e) => e.limitSetKey)).toEqual(["iec-61000-3-2-class-d", "iec-61000-3-2-class-a"]);
  });

  it("ends a broken CSV as failed with the reason and the line, and keeps the upload", async () => {
    const file = "fixtures/error-non-numeric.csv";
    const id = await upload(file, `Integration broken ${Date.now()}`);
    expect((await tech.request("POST", `/api/captures/${id}/uploaded`)).status).toBe(200);
    const done = await analyse(id);
    expect(done.status).toBe("failed");
    expect(done.failureReason).toMatch(/line \d+/);
    expect(done.failureReason).toMatch(/not a number/);
    const [row] = await db.select().from(captures).where(eq(captures.id, id));
    expect(Buffer.from(await getObjectBytes(row!.s3Key)).equals(readFileSync(file))).toBe(true);
    // The technician can fix the mapping and run again: the capture is not stuck.
    expect((await tech.request("POST", `/api/captures/${id}/analyze`)).status).toBe(202);
  });

  it("queues one job for five parallel analyse requests (a conditional update decides)", async () => {
    const id = await upload("fixtures/single-phase-50hz.csv", `Integration parallel analyse ${Date.now()}`);
    expect((await tech.request("POST", `/api/captures/${id}/uploaded`)).status).toBe(200);
    expect((await tech.request("PUT", `/api/captures/${id}/setup`, { mapping: { channels: {} }, limitSetKey: "iec-61000-3-2-class-a", context: {} })).status).toBe(200);
    const answers = await Promise.all(Array.from({ length: 5 }, () => tech.request("POST", `/api/captures/${id}/analyze`)));
    const statuses = answers.map((r) => r.status).sort();
    expect(statuses).toEqual([202, 409, 409, 409, 409]);
    const jobs = await sql`select id from pgboss.job where data->>'captureId' = ${id}`;
    expect(jobs).toHaveLength(1);
  });

  it("refuses files over the size cap and files that are not CSV exports, naming the problem", async () => {
    const big = await tech.request("POST", "/api/captures", { siteId, title: "Too big", filename: "big.csv", sizeBytes: 300 * 1024 * 1024 });
    expect(big.status).toBe(422);
    expect(JSON.stringify(await big.json())).toContain("200 MB");
    const pdf = await tech.request("POST", "/api/captures", { siteId, title: "Wrong type", filename: "scope.pdf", sizeBytes: 1000 });
    expect(pdf.status).toBe(422);
    expect(JSON.stringify(await pdf.json())).toContain(".csv");
  });

  it("shows viewers only signed-off captures", async () => {
    const viewer = await signedIn("viewer");
    const list = (await (await viewer.request("GET", "/api/captures")).json()) as { items: { approved: boolean; newerAwaitsReview: boolean }[] };
    expect(list.items.length).toBeGreaterThan(0);
    // A capture whose newer result is back in review stays listed with its approved evaluation.
    expect(list.items.every((c) => c.approved)).toBe(true);
  });
});
