import "server-only";
import { mkdtemp, rm } from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import type { Capture } from "@/db/schema";
import { getSiteById } from "@/db/queries/sites";
import { systemReader } from "@/lib/auth/permissions";
import type { EvaluationContext } from "@/lib/compliance/model";
import { importIntervalLogFile } from "@/lib/intervals/import-interval-log-file";
import { runIntervalLogEvaluation } from "@/lib/pipeline/run-interval-log-evaluation";
import type { LimitSetRevision } from "@/lib/pipeline/types";
import { downloadObjectToFile } from "@/lib/storage/s3";
import { intervalSetupMappingSchema } from "@/lib/validations/capture";
import { checkOriginal } from "./original-changed-error";

/**
 * Judges an interval log from its stored original (the logged series, never modified) with its
 * stored column mapping, in a context and against a limit-set revision. The original is copied to
 * a temporary file and read as a stream (memory does not grow with the file's text). The worker's
 * first evaluation and every later "evaluate again" run this, so the same context gives the same verdict.
 *
 * @throws IntervalLogError naming the line and column of a problem in the file or mapping;
 *   OriginalChangedError when the stored bytes are not the ones confirmed at upload.
 */
export async function evaluateStoredIntervalLog(
  capture: Capture,
  revision: LimitSetRevision,
  context: EvaluationContext,
): Promise<ReturnType<typeof runIntervalLogEvaluation> & { fileSha256: string; unmappedColumns: string[] }> {
  const { intervalMapping } = intervalSetupMappingSchema.parse(capture.mapping ?? {});
  const dir = await mkdtemp(path.join(os.tmpdir(), "ordwise-log-"));
  try {
    const file = path.join(dir, "original.csv");
    const [site, read] = await Promise.all([getSiteById({ id: capture.siteId, reader: systemReader }), downloadObjectToFile(capture.s3Key, file)]);
    // The bytes read must be the ones confirmed at upload (also on every "evaluate again").
    checkOriginal(capture.sha256, read.sha256);
    const log = await importIntervalLogFile(file, intervalMapping);
    return { ...runIntervalLogEvaluation(log, revision, context, site.frequencyHz === 60 ? 60 : 50), fileSha256: read.sha256, unmappedColumns: log.unmappedColumns };
  } finally {
    await rm(dir, { recursive: true, force: true });
  }
}
