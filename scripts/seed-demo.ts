// Seeds the demo captures once the object store runs: uploads each invented CSV, runs the
// analysis and evaluation exactly as the app does, and signs two of them off.
// Idempotent: a capture whose title exists is skipped. Run with --conditions=react-server
// (set by scripts/stack.mjs) so server-only modules load outside Next.js.
import { createHash } from "node:crypto";
import { readFileSync } from "node:fs";
import path from "node:path";
import { eq } from "drizzle-orm";
import { db, sql } from "@/db/client";
import { getEvaluation, recordReview, registerCapture, saveCaptureSetup, saveIntervalSetup, setCaptureStatus } from "@/db/queries/captures";
import { captures, sites, users } from "@/db/schema";
import { demoCaptures } from "@/db/seed/demo-captures";
import { seedDemoStudies } from "@/db/seed/demo-studies";
import { processCapture } from "@/lib/captures/process-capture";
import { systemReader } from "@/lib/auth/permissions";
import { inspectIntervalLog } from "@/lib/intervals/inspect-interval-log";
import { IntervalMappingSchema } from "@/lib/intervals/types";
import { putObject } from "@/lib/storage/s3";

async function userId(email: string): Promise<string> {
  const [u] = await db.select({ id: users.id }).from(users).where(eq(users.email, email));
  if (!u) throw new Error(`demo user ${email} is missing; run the seed first`);
  return u.id;
}

const technician = await userId("technician@ordwise.test");
const engineer = await userId("engineer@ordwise.test");

for (const demo of demoCaptures) {
  const [exists] = await db.select({ id: captures.id }).from(captures).where(eq(captures.title, demo.title));
  if (exists) continue;
  const [site] = await db.select({ id: sites.id }).from(sites).where(eq(sites.name, demo.siteName));
  if (!site) continue;
  const bytes = readFileSync(path.join("fixtures", demo.file));
  const kind = demo.kind ?? "waveform";
  const capture = await registerCapture({
    input: { siteId: site.id, kind, title: demo.title, filename: path.basename(demo.file), sizeBytes: bytes.length },
    actorId: technician,
  });
  await putObject(capture.s3Key, bytes, "text/csv");
  await setCaptureStatus({ id: capture.id, status: "uploaded", sizeBytes: bytes.length, sha256: createHash("sha256").update(bytes).digest("hex") });
  if (kind === "interval-log") {
    const suggested = inspectIntervalLog(bytes.toString("utf8")).suggestion.mapping;
    if (!suggested) throw new Error(`no column mapping could be suggested for ${demo.file}`);
    const intervalMapping = IntervalMappingSchema.parse(suggested);
    await saveIntervalSetup({ id: capture.id, setup: { intervalMapping, limitSetKey: demo.limitSetKey, context: demo.context }, actorId: technician, reader: systemReader });
  } else {
    await saveCaptureSetup({ id: capture.id, setup: { mapping: demo.mapping ?? { channels: {} }, limitSetKey: demo.limitSetKey, context: demo.context }, actorId: technician, reader: systemReader });
  }
  await processCapture({ captureId: capture.id, actorId: technician });
  const [done] = await db.select({ status: captures.status, reason: captures.failureReason }).from(captures).where(eq(captures.id, capture.id));
  if (done?.status !== "done") throw new Error(`demo capture "${demo.title}" did not analyse: ${done?.reason}`);
  await recordReview({ captureId: capture.id, action: "submitted", comment: "", actorId: technician });
  if (demo.approve) {
    const evaluation = await getEvaluation({ captureId: capture.id });
    await recordReview({ captureId: capture.id, action: "approved", comment: demo.approve, actorId: engineer, evaluationId: evaluation?.id });
  }
  console.log(`[ordwise] demo capture: ${demo.title}`);
}
await seedDemoStudies({ engineerId: engineer });
await sql.end();
