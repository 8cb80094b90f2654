// The analysis worker: takes capture jobs from the PostgreSQL-backed queue and runs them.
// `npm start` runs one beside the web server; more can run on other machines with the same
// DATABASE_URL and S3 settings (see README). Run with --conditions=react-server.
import { analyzeQueue, cleanupQueue, getBoss, type AnalyzeJob } from "@/lib/jobs/queue";
import { removeAbandonedUploads } from "@/lib/captures/remove-abandoned-uploads";
import { processCapture } from "@/lib/captures/process-capture";

// Test hook: pause before writing results so a test can kill the worker mid-run.
const pauseMs = Number(process.env.ORDWISE_TEST_PAUSE_BEFORE_STORE_MS ?? 0);

const boss = await getBoss({ supervise: true });
await boss.work<AnalyzeJob>(analyzeQueue, { batchSize: 1, pollingIntervalSeconds: 1, includeMetadata: true }, async ([job]) => {
  if (!job) return;
  await processCapture({
    captureId: job.data.captureId,
    actorId: job.data.actorId,
    finalAttempt: job.retryCount >= job.retryLimit,
    beforeStore: pauseMs > 0 ? () => new Promise((r) => setTimeout(r, pauseMs)) : undefined,
  });
});
await boss.work(cleanupQueue, { batchSize: 1, pollingIntervalSeconds: 2 }, async () => {
  const removed = await removeAbandonedUploads();
  if (removed > 0) process.stdout.write(`[ordwise] removed ${removed} capture(s) whose upload never completed\n`);
});
process.stdout.write(`[ordwise] analysis worker listening on queue ${analyzeQueue}\n`);

async function stop() {
  await boss.stop({ graceful: true, timeout: 10_000 });
  process.exit(0);
}
process.on("SIGTERM", stop);
process.on("SIGINT", stop);
