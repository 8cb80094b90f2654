// Issue 9 §5–6 through the real stack (bucket, preview route, worker): the encoding detected from
// the stored file's head gives the same columns in the preview and in the analysis; a time column
// running backwards is named in the preview; the setup route refuses a zero or negative scale.
import { readFileSync } from "node:fs";
import { eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { analyses } from "@/db/schema";
import { finishedCapture, uploadCapture, type FinishedCapture } from "../support/captures";
import { Client, signedIn } from "../support/http";

let tech: Client;
let siteId: string;

beforeAll(async () => {
  tech = await signedIn("technician");
  const sites = (await (await tech.request("GET", "/api/sites")).json()) as { sites: { id: string; name: string }[] };
  siteId = sites.sites.find((s) => s.name.startsWith("Bench B"))!.id;
});

type Preview = { preview: { columns: { header: string; role: string; quantity: string | null }[]; sampleIntervalS: number | null } | null; problem: string | null };

async function uploadAndPreview(file: string): Promise<{ id: string; preview: Preview }> {
  const id = await uploadCapture(tech, { siteId, title: `Encoding ${file} ${Date.now()}`, body: readFileSync(file), filename: file.split("/").pop() });
  const confirmed = await tech.request("POST", `/api/captures/${id}/uploaded`);
  expect(confirmed.status).toBe(200);
  return { id, preview: (await confirmed.json()) as Preview };
}

async function analyse(id: string, channels: Record<string, unknown> = {}): Promise<FinishedCapture> {
  expect((await tech.request("PUT", `/api/captures/${id}/setup`, { mapping: { channels }, limitSetKey: "iec-61000-3-2-class-a", context: { nominalVoltageV: 230 } })).status).toBe(200);
  expect((await tech.request("POST", `/api/captures/${id}/analyze`)).status).toBe(202);
  return finishedCapture(tech, id, 30_000);
}

describe("one encoding for preview and analysis", () => {
  it.each([
    ["fixtures/latin1-zeit-strom.csv", ["Zeit (µs)", "Strom (A)"], ["Strom (A)"]],
    ["fixtures/utf16le-bom.csv", ["Time (s)", "Va (V)", "Ia (A)"], ["Va (V)", "Ia (A)"]],
    ["fixtures/utf16be-bom.csv", ["Time (s)", "Va (V)", "Ia (A)"], ["Va (V)", "Ia (A)"]],
  ])("%s: the preview's columns are the analysis's channels", async (file, headers, channels) => {
    const { id, preview } = await uploadAndPreview(file);
    expect(preview.problem).toBeNull();
    expect(preview.preview!.columns.map((c) => c.header)).toEqual(headers);
    expect(preview.preview!.columns[0]!.role).toBe("time");
    // 6400 S/s in every fixture: 156.25 µs.
    expect(preview.preview!.sampleIntervalS!).toBeCloseTo(156.25e-6, 12);
    expect(await analyse(id)).toMatchObject({ status: "done", failureReason: null });
    const [stored] = await db.select().from(analyses).where(eq(analyses.captureId, id));
    expect(stored?.result.channels.map((c) => c.name)).toEqual(channels);
    expect(stored?.result.sampleIntervalS).toBeCloseTo(156.25e-6, 12);
  });

  it("a time column running backwards is named in the preview and in the failure, with its line", async () => {
    const { id, preview } = await uploadAndPreview("fixtures/error-time-backwards.csv");
    expect(preview.problem).toMatch(/^time axis runs backwards at line 3: /);
    expect(preview.preview!.sampleIntervalS).toBeNull();
    const done = await analyse(id);
    expect(done.status).toBe("failed");
    expect(done.failureReason).toMatch(/time axis runs backwards at line 3/);
  });

  it.each([0, -40])("the setup route refuses a scale of %d (422, the field named)", async (scale) => {
    const { id } = await uploadAndPreview("fixtures/snake-case-names.csv");
    const res = await tech.request("PUT", `/api/captures/${id}/setup`, {
      mapping: { channels: { i_load: { quantity: "current", scale } } },
      limitSetKey: "iec-61000-3-2-class-a",
      context: {},
    });
    expect(res.status).toBe(422);
    expect(JSON.stringify(await res.json())).toMatch(/Scale must be greater than zero/);
  });
});
