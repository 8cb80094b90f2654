import "server-only";
import PgBoss from "pg-boss";

// Analysis runs as jobs in a PostgreSQL-backed queue (pg-boss), so more workers — on this
// machine or others, against the same database and bucket — can share the load.
export const analyzeQueue = process.env.JOB_QUEUE ?? "analyze-capture";
// Hourly removal of captures whose upload never completed (lib/captures/remove-abandoned-uploads.ts).
export const cleanupQueue = `${analyzeQueue}-cleanup`;
export const cleanupCron = "17 * * * *";

export interface AnalyzeJob {
  captureId: string;
  actorId: string | null;
}

// One retry: a job whose worker crashed, or that hit an internal error, runs once more.
export const queuePolicy = {
  retryLimit: 1,
  retryDelay: 1,
  // A worker that dies mid-run leaves its job active; after this long it is retried elsewhere.
  expireInSeconds: Number(process.env.JOB_EXPIRE_S ?? 900),
};

let started: Promise<PgBoss> | null = null;

/** The process's pg-boss instance, started once. Workers also run its maintenance (expiry, retries). */
export function getBoss({ supervise = false }: { supervise?: boolean } = {}): Promise<PgBoss> {
  started ??= (async () => {
    const url = process.env.DATABASE_URL;
    if (!url) throw new Error("DATABASE_URL is not set");
    const boss = new PgBoss({
      connectionString: url,
      schema: "pgboss",
      supervise,
      // The worker (supervise) also runs the clock that turns schedules into jobs.
      schedule: supervise,
      max: 4,
      maintenanceIntervalSeconds: Number(process.env.JOB_MAINTENANCE_S ?? 30),
    });
    boss.on("error", (err) => console.error("[jobs]", err.message));
    await boss.start();
    await boss.createQueue(analyzeQueue, { name: analyzeQueue, ...queuePolicy });
    await boss.createQueue(cleanupQueue, { name: cleanupQueue, retryLimit: 1 });
    if (supervise) await boss.schedule(cleanupQueue, cleanupCron, {}, { tz: "UTC" });
    return boss;
  })();
  return started;
}

/** Puts a capture's analysis on the queue; returns the job id. */
export async function enqueueAnalysis(job: AnalyzeJob): Promise<string> {
  const boss = await getBoss();
  const id = await boss.send(analyzeQueue, job, queuePolicy);
  if (!id) throw new Error("the job queue refused the analysis job");
  return id;
}
