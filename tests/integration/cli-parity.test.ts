// One pipeline: the same capture through the worker (upload → queue → stored evaluation) and through
// the real `npm run analyze -- … --json` against the same database gives the same judgement.
import { mkdtempSync, readFileSync, rmSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { evaluations } from "@/db/schema";
import { writeClassABurst } from "@/fixtures/burst/class-a-burst";
import { json, uploadCapture, waitForCapture } from "../support/captures";
import { Client, signedIn } from "../support/http";
import { runAnalyzeCli } from "../support/run-analyze-cli";

let tech: Client;
let siteId: string;
let dir: string;
let file: string;
const capturedAt = "2024-03-04T12:00:00.000Z";

beforeAll(async () => {
  tech = await signedIn("technician");
  const sites = await json<{ sites: { id: string; name: string }[] }>(await tech.request("GET", "/api/sites"));
  siteId = sites.sites.find((s) => s.name.startsWith("Bench B"))!.id;
  dir = mkdtempSync(path.join(os.tmpdir(), "ordwise-parity-"));
  file = path.join(dir, "class-a-burst.csv");
  await writeClassABurst(file);
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** Uploads, maps and analyses through the app and its worker; returns the stored first evaluation. */
async function throughWorker(context: Record<string, unknown>) {
  const id = await uploadCapture(tech, { siteId, title: `Parity ${Date.now()}`, body: readFileSync(file), filename: "class-a-burst.csv", capturedAt });
  await json(await tech.request("POST", `/api/captures/${id}/uploaded`));
  await json(await tech.request("PUT", `/api/captures/${id}/setup`, { mapping: { channels: { "I (A)": { scale: 1 } } }, limitSetKey: "iec-61000-3-2-class-a", context }));
  expect((await tech.request("POST", `/api/captures/${id}/analyze`)).status).toBe(202);
  await waitForCapture(tech, id, 120_000);
  const [evaluation] = await db.select().from(evaluations).where(eq(evaluations.captureId, id));
  return evaluation!;
}

describe("the command line and the worker run one pipeline", () => {
  it("a bursting Class A capture gets the same per-order verdicts, deciding rules and aggregates both ways", async () => {
    const stored = await throughWorker({ nominalVoltageV: 230 });
    // Without --bus-voltage, a 230 V system voltage is taken as the channels' nominal voltage, as the form's 230 V above.
    const cli = runAnalyzeCli([file, "--json", "--limits", "iec-61000-3-2-class-a", "--scale", "I (A)=1", "--nominal-voltage", "230", "--start", capturedAt], {
      env: { ...process.env },
      timeoutMs: 120_000,
    });
    expect(cli.stderr).toBe("");
    expect(cli.status).toBe(0);
    const out = JSON.parse(cli.stdout) as { limitSetSource: string; compliance: typeof stored.result };
    // The CLI read the same current revision from the database the worker used.
    expect(out.limitSetSource).toBe("database");
    expect(String(out.compliance.revision.id)).toBe(stored.limitSetRevisionId);

    const judged = (r: typeof stored.result) =>
      JSON.parse(JSON.stringify({ verdict: r.verdict, rows: r.rows, aggregates: r.aggregates, timeBasis: r.timeBasis, timeRules: r.timeRules })) as unknown;
    expect(judged(out.compliance)).toEqual(judged(stored.result));
    // …and that shared answer is the time rules' (IEC 61000-3-2:2018+A1:2020 clause 6.2, 150 % of the Table 1 h3 limit 2.30 A — the 150 % from memory), clock-aligned.
    const h3 = stored.result.rows.find((r) => r.order === 3)!;
    expect(h3).toMatchObject({ verdict: "fail", decidedBy: "smoothed-max" });
    expect(stored.result.timeBasis?.startMs).toBe(Date.parse(capturedAt));
    expect(stored.result.verdict).toBe("fail");
  }, 240_000); // spawns the CLI (up to 120 s under load) after an upload and a worker run
});
