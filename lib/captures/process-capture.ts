import "server-only";
import { getCaptureById, getCurrentRevision, setCapturedAt, setCaptureStatus, storeAnalysisResult } from "@/db/queries/captures";
import { isAnalysisInputError } from "@/lib/analysis/errors";
import { EvaluationContextSchema } from "@/lib/compliance/model";
import { mkdtemp, rm } from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import { runCaptureAnalysis } from "@/lib/pipeline/run-capture-analysis";
import { runCaptureEvaluation } from "@/lib/pipeline/run-capture-evaluation";
import { downloadObjectToFile } from "@/lib/storage/s3";
import { systemReader } from "@/lib/auth/permissions";
import { IntervalLogError } from "@/lib/intervals/errors";
import { captureMappingSchema } from "@/lib/validations/capture";
import { CaptureSetupError } from "./capture-setup-error";
import { evaluateStoredIntervalLog } from "./evaluate-stored-interval-log";
import { checkOriginal, OriginalChangedError } from "./original-changed-error";

const internalReason = "The analysis stopped on an internal error twice. The upload is kept; try again, and tell an admin if it repeats.";

/**
 * Runs one capture from its stored original to a stored analysis and evaluation.
 * A problem with the file or the mapping ends as status "failed" with a reason a technician can
 * act on. An internal error is rethrown while `finalAttempt` is false (the queue retries the job)
 * and recorded as "failed" on the final attempt. The original upload stays in the bucket untouched.
 */
export async function processCapture({
  captureId,
  actorId,
  finalAttempt = true,
  beforeStore,
}: {
  captureId: string;
  actorId: string | null;
  finalAttempt?: boolean;
  /** Called between the computation and the write (lets tests interrupt a run). */
  beforeStore?: () => Promise<void>;
}): Promise<void> {
  try {
    const capture = await getCaptureById({ id: captureId, reader: systemReader });
    await setCaptureStatus({ id: captureId, status: "running", progressPercent: 5, failureReason: null });
    const context = EvaluationContextSchema.parse(capture.context ?? {});
    if (!capture.limitSetKey) throw new CaptureSetupError("no-limit-set");
    const revision = await getCurrentRevision({ key: capture.limitSetKey });
    // What the result is made of, stored beside it so a sign-off names the set-up behind it;
    // the file hash is the one of the bytes this run read (checked against the confirmed one).
    const setup: { setup: Record<string, unknown>; setupBy: string | null; fileSha256: string | null } = {
      setup: { mapping: capture.mapping ?? {}, limitSetKey: capture.limitSetKey, context: capture.context ?? {} },
      setupBy: capture.setupBy,
      fileSha256: capture.sha256,
    };
    if (capture.kind === "interval-log") {
      await setCaptureStatus({ id: captureId, status: "running", progressPercent: 25 });
      const { analysis, trends, result, startMs, fileSha256, unmappedColumns } = await evaluateStoredIntervalLog(capture, revision, context);
      setup.fileSha256 = fileSha256;
      // The set-up summary names the file's columns the mapping left out.
      setup.setup = { ...setup.setup, unmappedColumns };
      await beforeStore?.();
      // A log says when it was recorded: its first timestamp, unless the technician gave a time.
      if (!capture.capturedAt) await setCapturedAt({ id: captureId, capturedAt: new Date(startMs) });
      await storeAnalysisResult({ captureId, analysis, waveform: null, trends, evaluation: { revisionId: revision.revisionId, context, result }, actorId, setup });
      return;
    }
    const mapping = captureMappingSchema.parse(capture.mapping ?? {});
    // Waveform records can be hundreds of MB: copied to a temporary file and analysed as a stream.
    const dir = await mkdtemp(path.join(os.tmpdir(), "ordwise-capture-"));
    let analysed: Awaited<ReturnType<typeof runCaptureAnalysis>>;
    try {
      const file = path.join(dir, "original.csv");
      const read = await downloadObjectToFile(capture.s3Key, file);
      setup.fileSha256 = read.sha256;
      checkOriginal(capture.sha256, read.sha256);
      await setCaptureStatus({ id: captureId, status: "running", progressPercent: 25 });
      analysed = await runCaptureAnalysis(file, mapping, context);
    } finally {
      await rm(dir, { recursive: true, force: true });
    }
    const { analysis, waveform } = analysed;
    await setCaptureStatus({ id: captureId, status: "running", progressPercent: 80 });
    // The record's start (the technician's capture time) aligns 10-minute values to the clock.
    const result = runCaptureEvaluation(analysis, revision, context, capture.capturedAt?.getTime());
    await beforeStore?.();
    await storeAnalysisResult({ captureId, analysis, waveform, evaluation: { revisionId: revision.revisionId, context, result }, actorId, setup });
  } catch (err) {
    // File and set-up problems are expected (typed errors with a message for the technician).
    const expected = isAnalysisInputError(err) || err instanceof IntervalLogError || err instanceof CaptureSetupError || err instanceof OriginalChangedError;
    if (!expected) {
      console.error(err);
      if (!finalAttempt) {
        await setCaptureStatus({ id: captureId, status: "queued", progressPercent: 0, failureReason: null }).catch(() => undefined);
        throw err;
      }
    }
    const reason = expected ? err.message : internalReason;
    await setCaptureStatus({ id: captureId, status: "failed", failureReason: reason, progressPercent: 0 }).catch(() => undefined);
  }
}
