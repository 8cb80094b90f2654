import { readFileSync } from "node:fs";
import { eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { analyses, captures, evaluations, sites } from "@/db/schema";
import { finishedCapture, uploadCapture, type FinishedCapture } from "../support/captures";
import { Client, signedIn } from "../support/http";
import { pdfPageTexts } from "../unit/reports/pdf-text";

let tech: Client;
let siteId: string;

beforeAll(async () => {
  tech = await signedIn("technician");
  const list = (await (await tech.request("GET", "/api/sites")).json()) as { sites: { id: string; name: string }[] };
  siteId = list.sites.find((s) => s.name.startsWith("Harrowgate"))!.id;
});

async function uploadLog(file: string): Promise<string> {
  const id = await uploadCapture(tech, { siteId, kind: "interval-log", title: `Log ${Date.now()}`, body: readFileSync(file), filename: "log.csv" });
  expect((await tech.request("POST", `/api/captures/${id}/uploaded`)).status).toBe(200);
  return id;
}

async function evaluate(id: string): Promise<FinishedCapture> {
  expect((await tech.request("POST", `/api/captures/${id}/analyze`)).status).toBe(202);
  return finishedCapture(tech, id, 60_000);
}

/** A column of the week fixture as numbers, read here from the file (not through the product's import). */
function fixtureColumn(header: string): number[] {
  const lines = readFileSync("fixtures/intervals/week-10min-3ch.csv", "utf8").split(/\r?\n/);
  const at = lines.findIndex((l) => l.startsWith("Timestamp,"));
  const index = lines[at]!.split(",").indexOf(header);
  return lines.slice(at + 1).filter((l) => l.trim() !== "").map((l) => Number(l.split(",")[index]));
}

/** Nearest-rank percentile (IEEE Std 519-2014 clause 3: the value exceeded for (100 − p) % of the period), by sorting. */
const nearestRank = (values: number[], p: number) => [...values].sort((a, b) => a - b)[Math.ceil((p / 100) * values.length) - 1]!;

describe("interval logs through the queue", () => {
  it("suggests a mapping, remembers it for the site, and judges a week with the IEEE Std 519-2014 §5.2 percentile rules", async () => {
    const id = await uploadLog("fixtures/intervals/week-10min-3ch.csv");
    const preview = (await (await tech.request("GET", `/api/captures/${id}/interval-preview`)).json()) as {
      preview: { suggestion: { mapping: { timestamp: { column: string }; columns: { column: string; order?: number }[] } } };
    };
    const mapping = preview.preview.suggestion.mapping;
    expect(mapping.timestamp.column).toBe("Timestamp");
    // The "max" columns are not averages and are left out of the suggestion.
    expect(mapping.columns.some((c) => c.column.includes(" max "))).toBe(false);

    const setup = await tech.request("PUT", `/api/captures/${id}/interval-setup`, {
      intervalMapping: mapping,
      limitSetKey: "ieee-519-2014-current",
      context: { iscA: 2400, ilA: 60, busVoltageV: 480 },
    });
    expect(setup.status).toBe(200);
    const [site] = await db.select().from(sites).where(eq(sites.id, siteId));
    expect(site?.intervalMapping).toEqual(expect.objectContaining({ timestamp: expect.objectContaining({ column: "Timestamp" }) }));

    const done = await evaluate(id);
    expect(done).toMatchObject({ status: "done", failureReason: null });
    const [evaluation] = await db.select().from(evaluations).where(eq(evaluations.captureId, id));
    const rules = evaluation!.result.timeRules?.map((r) => r.label) ?? [];
    // IEEE Std 519-2014 §5.2: daily 99th percentile of 3 s values, weekly 99th and 95th percentiles of 10 min values.
    expect(rules).toHaveLength(3);
    // A week of 10-minute rows: 1,008 values; the 95th-percentile rule over them decides order 5.
    const h5 = evaluation!.result.rows.find((r) => r.order === 5)!;
    expect(h5.rowRules?.some((r) => r.verdict !== "not-evaluated")).toBe(true);
    // The log's first timestamp (fixtures/intervals/generate.ts starts it at 2024-03-04 00:00 UTC) dates the capture.
    const [row] = await db.select().from(captures).where(eq(captures.id, id));
    expect(row?.capturedAt?.toISOString()).toBe("2024-03-04T00:00:00.000Z");
    const [analysis] = await db.select().from(analyses).where(eq(analyses.captureId, id));
    expect(analysis?.trends?.[0]?.timestampsMs.length).toBe(1008);
  });

  it("shows the log's headline numbers on the sheet, the share page, the CSV and PDF page 1, with 'not logged' for what it lacks", async () => {
    const id = await uploadLog("fixtures/intervals/week-10min-3ch.csv");
    const preview = (await (await tech.request("GET", `/api/captures/${id}/interval-preview`)).json()) as { preview: { suggestion: { mapping: unknown } } };
    const setup = { intervalMapping: preview.preview.suggestion.mapping, limitSetKey: "ieee-519-2014-current", context: { iscA: 2400, ilA: 60, busVoltageV: 480 } };
    expect((await tech.request("PUT", `/api/captures/${id}/interval-setup`, setup)).status).toBe(200);
    expect(await evaluate(id)).toMatchObject({ status: "done" });

    // Worked from the file here: I3's THD and TDD = THD × H1 / IL (IEEE Std 519-2014 clause 3) per 10-minute row, 95th percentile by nearest rank.
    const thd = fixtureColumn("I3 THD avg [%]");
    const h1 = fixtureColumn("I3 H1 avg [A]");
    expect(thd).toHaveLength(1008);
    const thdP95 = nearestRank(thd, 95);
    const tddP95 = nearestRank(thd.map((t, k) => (t / 100) * h1[k]! / 60 * 100), 95);
    const rmsMax = Math.max(...fixtureColumn("I3 rms avg [A]"));

    const engineer = await signedIn("engineer");
    const sheet = await (await engineer.request("GET", `/captures/${id}`)).text();
    const { url } = (await (await engineer.request("POST", `/api/captures/${id}/shares`, { label: "utility", expiresInDays: 7 })).json()) as { url: string };
    const shared = await (await fetch(url)).text();
    for (const html of [sheet, shared]) {
      expect(html).toContain("Currents over the logged period");
      expect(html).toContain("TDD (% of IL = 60 A), 95th percentile");
      expect(html).toContain(`>${tddP95.toFixed(2)}<`);
      expect(html).toContain(`>${thdP95.toFixed(2)}<`);
      expect(html).toMatch(/Power \(P, S, displacement, distortion and true power factor\)<\/span>: <span[^>]*>not logged</);
    }

    const csv = (await (await engineer.request("GET", `/api/captures/${id}/sheet-csv`)).text()).split("\r\n");
    const i3 = csv.find((line) => line.startsWith("I3,") && line.split(",").length === 8)!.split(",").map(Number);
    // RMS mean, RMS max, fundamental mean, THD p95, THD max, TDD p95, TDD max.
    expect(i3[2]).toBeCloseTo(rmsMax, 6);
    expect(i3[4]).toBeCloseTo(thdP95, 6);
    expect(i3[6]).toBeCloseTo(tddP95, 5);
    expect(csv).toContain('"Voltages (r.m.s., THD)",not logged');

    const pdf = await engineer.request("GET", `/api/captures/${id}/report`);
    const first = pdfPageTexts(Buffer.from(await pdf.arrayBuffer()))[0]!;
    expect(first).toMatch(/Headline numbers . currents over the logged period/);
    expect(first).toContain(tddP95.toFixed(2));
    expect(first).toMatch(/Voltages \(r\.m\.s\., THD\)\s*not logged/);
  });

  it("evaluates again from the logged series: the same context gives the first evaluation's verdict, another context judges the rows anew", async () => {
    const id = await uploadLog("fixtures/intervals/week-10min-3ch.csv");
    const preview = (await (await tech.request("GET", `/api/captures/${id}/interval-preview`)).json()) as { preview: { suggestion: { mapping: unknown } } };
    const context = { iscA: 2400, ilA: 60, busVoltageV: 480 };
    const setup = { intervalMapping: preview.preview.suggestion.mapping, limitSetKey: "ieee-519-2014-current", context };
    expect((await tech.request("PUT", `/api/captures/${id}/interval-setup`, setup)).status).toBe(200);
    expect(await evaluate(id)).toMatchObject({ status: "done" });
    const [first] = await db.select().from(evaluations).where(eq(evaluations.captureId, id));
    if (!first) throw new Error("no first evaluation stored");

    const engineer = await signedIn("engineer");
    const again = await engineer.request("POST", `/api/captures/${id}/evaluations`, { limitSetKey: "ieee-519-2014-current", context });
    expect(again.status).toBe(201);
    const { evaluationId } = (await again.json()) as { evaluationId: string };
    const [second] = await db.select().from(evaluations).where(eq(evaluations.id, evaluationId));
    const judged = (r: typeof first.result) => ({ verdict: r.verdict, rows: r.rows, aggregates: r.aggregates, timeRules: r.timeRules });
    expect(second!.result.rows.length).toBeGreaterThan(0);
    expect(judged(second!.result)).toEqual(judged(first.result));

    // Twice the load current IL: IEEE Std 519-2014 Table 2 limits are in % of IL, so every logged order's
    // percentile in %IL halves (an independent consequence of the definition, not of the code).
    const doubled = await engineer.request("POST", `/api/captures/${id}/evaluations`, { limitSetKey: "ieee-519-2014-current", context: { iscA: 4800, ilA: 120, busVoltageV: 480 } });
    expect(doubled.status).toBe(201);
    const [third] = await db.select().from(evaluations).where(eq(evaluations.id, ((await doubled.json()) as { evaluationId: string }).evaluationId));
    const h5Rules = (r: typeof first.result) => r.rows.find((row) => row.order === 5)!.rowRules!.filter((rule) => rule.measured !== null);
    const firstRules = h5Rules(first.result);
    expect(firstRules.length).toBeGreaterThan(0);
    for (const rule of firstRules) expect(h5Rules(third!.result).find((r) => r.rule === rule.rule)!.measured).toBeCloseTo(rule.measured! / 2, 9);
  });

  it("ends a log with a malformed row as failed, naming the line", async () => {
    const id = await uploadLog("fixtures/intervals/error-malformed-row.csv");
    const preview = (await (await tech.request("GET", `/api/captures/${id}/interval-preview`)).json()) as {
      preview: { suggestion: { mapping: unknown } };
    };
    await tech.request("PUT", `/api/captures/${id}/interval-setup`, {
      intervalMapping: preview.preview.suggestion.mapping,
      limitSetKey: "ieee-519-2014-current",
      context: { iscA: 2400, ilA: 60, busVoltageV: 480 },
    });
    const done = await evaluate(id);
    expect(done.status).toBe("failed");
    expect(done.failureReason).toMatch(/line \d+/);
  });

  it("refuses an interval mapping that names no columns, with a field error", async () => {
    const id = await uploadLog("fixtures/intervals/week-10min-3ch.csv");
    const res = await tech.request("PUT", `/api/captures/${id}/interval-setup`, {
      intervalMapping: { timestamp: { column: "Timestamp" }, columns: [] },
      limitSetKey: "ieee-519-2014-current",
      context: {},
    });
    expect(res.status).toBe(422);
    expect(JSON.stringify(await res.json())).toContain("intervalMapping.columns");
  });
});
