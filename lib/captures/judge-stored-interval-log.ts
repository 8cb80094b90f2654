import "server-only";
import type { Capture } from "@/db/schema";
import { getSiteById } from "@/db/queries/sites";
import type { EvaluationContext } from "@/lib/compliance/model";
import { judgeIntervalLog } from "@/lib/pipeline/run-interval-log";
import type { LimitSetRevision } from "@/lib/pipeline/run-capture";
import { getObjectBytes } from "@/lib/storage/s3";
import { intervalSetupMappingSchema } from "@/lib/validations/capture";
import { decodeText } from "./decode-text";

/**
 * Judges an interval log from its stored original (the logged series, never modified) with its
 * stored column mapping, in a context and against a limit-set revision. The worker's first
 * evaluation and every later "evaluate again" run this, so the same context gives the same verdict.
 *
 * @throws IntervalLogError naming the line and column of a problem in the file or mapping.
 */
export async function judgeStoredIntervalLog(capture: Capture, revision: LimitSetRevision, context: EvaluationContext): Promise<ReturnType<typeof judgeIntervalLog>> {
  const { intervalMapping } = intervalSetupMappingSchema.parse(capture.mapping ?? {});
  const [bytes, site] = await Promise.all([getObjectBytes(capture.s3Key), getSiteById({ id: capture.siteId })]);
  return judgeIntervalLog(decodeText(bytes), intervalMapping, revision, context, site.frequencyHz === 60 ? 60 : 50);
}
