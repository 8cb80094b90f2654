import { spawn, type ChildProcess } from "node:child_process";
import { readFileSync } from "node:fs";
import path from "node:path";
import { eq } from "drizzle-orm";
import PgBoss from "pg-boss";
import { afterAll, describe, expect, it } from "vitest";
import { db, sql } from "@/db/client";
import { captures } from "@/db/schema";
import { uploadCapture } from "../support/captures";
import { signedIn } from "../support/http";
import { pollFor } from "../support/poll";

// A queue of its own, so the worker that `npm test` runs beside the app never takes these jobs.
const queue = `analyze-capture-killtest-${Date.now()}`;
const workers: ChildProcess[] = [];
// pg-boss also times out a running handler after this long, so the first worker is killed well
// before it (its run pauses for a minute before storing); the dead worker's job then expires and
// the second worker's maintenance puts it back for the retry.
const expireS = 8;

function startWorker(extraEnv: Record<string, string>): ChildProcess {
  const child = spawn(path.resolve("node_modules/.bin/tsx"), ["--conditions=react-server", "scripts/worker.ts"], {
    env: { ...process.env, JOB_QUEUE: queue, JOB_EXPIRE_S: String(expireS), JOB_MAINTENANCE_S: "1", ...extraEnv },
    stdio: ["ignore", "ignore", "inherit"],
    // Its own process group: tsx runs the script in a child process, and a kill must reach both.
    detached: true,
  });
  workers.push(child);
  return child;
}

afterAll(() => {
  for (const w of workers) {
    try {
      process.kill(-w.pid!, "SIGKILL");
    } catch {
      // already gone
    }
  }
});

describe("analysis jobs in the PostgreSQL-backed queue", () => {
  it("retries a job whose worker was killed mid-run, and the retry completes", async () => {
    const tech = await signedIn("technician");
    const sites = (await (await tech.request("GET", "/api/sites")).json()) as { sites: { id: string; name: string }[] };
    const siteId = sites.sites.find((s) => s.name.startsWith("Bench B"))!.id;
    const id = await uploadCapture(tech, { siteId, title: `Killed worker ${Date.now()}`, body: readFileSync("fixtures/demo/bench-b-heater-controller.csv"), filename: "heater.csv" });
    expect((await tech.request("POST", `/api/captures/${id}/uploaded`)).status).toBe(200);
    await tech.request("PUT", `/api/captures/${id}/setup`, { mapping: { channels: {} }, limitSetKey: "iec-61000-3-2-class-a", context: {} });

    // The first worker pauses after computing and before storing: kill it there.
    const first = startWorker({ ORDWISE_TEST_PAUSE_BEFORE_STORE_MS: "120000" });
    const boss = new PgBoss({ connectionString: process.env.DATABASE_URL!, schema: "pgboss", supervise: false, schedule: false });
    await boss.start();
    await boss.createQueue(queue, { name: queue, retryLimit: 1, retryDelay: 1, expireInSeconds: expireS });
    const jobId = await boss.send(queue, { captureId: id, actorId: null }, { retryLimit: 1, retryDelay: 1, expireInSeconds: expireS });
    expect(jobId).toBeTruthy();

    await pollFor(
      "the first run to reach 80 %",
      async () => {
        const [c] = await db.select().from(captures).where(eq(captures.id, id));
        return c?.status === "running" && c.progressPercent >= 80 ? c : null;
      },
      { timeoutMs: 45_000 },
    );
    process.kill(-first.pid!, "SIGKILL");

    startWorker({});
    const done = await pollFor(
      "the retried job to finish",
      async () => {
        const [c] = await db.select().from(captures).where(eq(captures.id, id));
        return c?.status === "done" || c?.status === "failed" ? c : null;
      },
      { timeoutMs: 90_000, explain: async () => JSON.stringify(await sql`select state, retry_count, started_on, start_after from pgboss.job where id = ${jobId!}`) },
    );
    expect(done.status).toBe("done");
    const [job] = await sql`select state, retry_count from pgboss.job where id = ${jobId!}`;
    expect(job).toMatchObject({ state: "completed", retry_count: 1 });
    await boss.stop({ graceful: false });
  }, 150_000); // spawns two worker processes and waits for a retry
});
