import "server-only";
import { and, count, desc, eq, gte, inArray, isNull, lt, sql as dsql } from "drizzle-orm";
import { db, type Tx } from "@/db/client";
import {
  analyses,
  captures,
  evaluations,
  limitSetRevisions,
  limitSets,
  reviewEvents,
  shareLinks,
  sites,
  users,
  type Capture,
} from "@/db/schema";
import type { AnalysisResult } from "@/lib/analysis/types";
import { can, readsApprovedResultOnly, type Reader } from "@/lib/auth/permissions";
import type { EvaluationContext, LimitSetRevisionContent } from "@/lib/compliance/model";
import { LimitSetRevisionContentSchema } from "@/lib/compliance/model";
import type { ComplianceResult } from "@/lib/compliance/result";
import { AppError } from "@/lib/errors";
import type { IntervalTrend } from "@/lib/intervals/evaluate-interval-log";
import { reviewActionLabels, reviewStateLabels } from "@/lib/reports/format";
import { fourEyesConflict } from "@/lib/reviews/four-eyes-conflict";
import { reviewTransition, type ReviewEvent } from "@/lib/reviews/review-transition";
import { buildChartData, type ChartData } from "@/lib/reports/chart-data";
import { storedGzip } from "@/lib/reports/stored-gzip";
import { analysisSummary } from "@/lib/reports/analysis-summary";
import type { Waveform } from "@/lib/pipeline/types";
import type { CaptureListQuery, CaptureSetup, IntervalSetup, RegisterCaptureInput } from "@/lib/validations/capture";
import { insertAuditEvent } from "./audit";
import { capturesVisibleTo } from "./scope";
import { insertSheetParts } from "./sheet";

export const capturesPerPage = 20;

/** The 409 for a review event the capture's state does not allow, naming the allowed ones. */
function refuseTransition(state: Capture["reviewState"], event: ReviewEvent, allowed: ReviewEvent[]): AppError {
  const names = allowed.filter((a) => a !== "new_result").map((a) => reviewActionLabels[a] ?? a);
  const what = event === "new_result" ? "store a new result" : (reviewActionLabels[event] ?? event).toLowerCase();
  return new AppError("conflict", `Cannot ${what}: the capture is "${reviewStateLabels[state] ?? state}". Allowed now: ${names.join(", ")}.`);
}

/** A new analysis or evaluation was stored: an approved capture goes back into review (the approval stays on its evaluation). */
async function onNewResult(tx: Tx, captureId: string): Promise<void> {
  const [c] = await tx.select({ reviewState: captures.reviewState }).from(captures).where(eq(captures.id, captureId)).for("update");
  if (!c) return;
  const t = reviewTransition(c.reviewState, "new_result");
  if (t.ok && t.next !== c.reviewState) await tx.update(captures).set({ reviewState: t.next, updatedAt: new Date() }).where(eq(captures.id, captureId));
}

/**
 * The set-up is frozen once submitted: nobody changes it while in review; after approval only a
 * reviewer may (and the new result starts a new review). Throws otherwise.
 */
function assertSetupEditable(capture: Capture, reader: Reader): void {
  if (capture.status === "queued" || capture.status === "running") throw new AppError("conflict", "The analysis is running; wait for it to finish before changing the set-up.");
  if (capture.reviewState === "in_review") {
    throw new AppError("conflict", "The set-up is frozen while the capture is in review. An engineer can send it back to change it.");
  }
  if (capture.reviewState === "approved" && !can(reader.role, "captures:review")) {
    throw new AppError("forbidden", "The capture is approved: only an engineer may change its set-up, and the new result needs a new review.");
  }
}

export async function registerCapture({ input, actorId }: { input: RegisterCaptureInput; actorId: string }): Promise<Capture> {
  const id = crypto.randomUUID();
  return db.transaction(async (tx) => {
    const [site] = await tx.select({ id: sites.id, frequencyHz: sites.frequencyHz }).from(sites).where(eq(sites.id, input.siteId));
    if (!site) throw new AppError("validation", "Choose a site", { siteId: ["No such site"] });
    const [capture] = await tx
      .insert(captures)
      .values({
        id,
        siteId: input.siteId,
        title: input.title,
        kind: input.kind,
        originalFilename: input.filename,
        sizeBytes: input.sizeBytes,
        s3Key: `captures/${id}/original`,
        status: "uploading",
        capturedAt: input.capturedAt ? new Date(input.capturedAt) : null,
        uploadedBy: actorId,
      })
      .returning();
    await insertAuditEvent(tx, { actorId, action: "capture.register", entityType: "capture", entityId: id, details: { title: input.title } });
    return capture!;
  });
}

/** One capture as `reader` may see it (viewers: approved sheets of their customers' sites); otherwise not found. */
export async function getCaptureById({ id, reader }: { id: string; reader: Reader }): Promise<Capture> {
  const [capture] = await db
    .select()
    .from(captures)
    .where(and(eq(captures.id, id), capturesVisibleTo(reader)));
  if (!capture) throw new AppError("not_found", "No such capture.");
  return capture;
}

export async function setCaptureStatus({
  id,
  status,
  progressPercent,
  failureReason,
  sizeBytes,
  sha256,
}: {
  id: string;
  status: Capture["status"];
  progressPercent?: number;
  failureReason?: string | null;
  sizeBytes?: number;
  sha256?: string;
}): Promise<void> {
  await db
    .update(captures)
    .set({
      status,
      updatedAt: new Date(),
      ...(progressPercent !== undefined ? { progressPercent } : {}),
      ...(failureReason !== undefined ? { failureReason } : {}),
      ...(sizeBytes !== undefined ? { sizeBytes } : {}),
      ...(sha256 !== undefined ? { sha256 } : {}),
    })
    .where(eq(captures.id, id));
}

/**
 * Moves a capture to "queued" in one conditional UPDATE, so of several simultaneous requests exactly
 * one wins and queues a job. Refuses (with the reason) a capture that is uploading, already queued or
 * running, has no limit set, is in review, or is approved and the actor is not a reviewer.
 */
export async function startAnalysis({ id, reader }: { id: string; reader: Reader }): Promise<void> {
  const reviewer = can(reader.role, "captures:review");
  const [won] = await db
    .update(captures)
    .set({ status: "queued", progressPercent: 0, failureReason: null, updatedAt: new Date() })
    .where(
      and(
        eq(captures.id, id),
        capturesVisibleTo(reader),
        inArray(captures.status, ["uploaded", "done", "failed"]),
        dsql`${captures.limitSetKey} is not null`,
        dsql`${captures.reviewState} <> 'in_review'`,
        reviewer ? undefined : dsql`${captures.reviewState} <> 'approved'`,
      ),
    )
    .returning({ id: captures.id });
  if (won) return;
  const capture = await getCaptureById({ id, reader });
  if (capture.status === "uploading") throw new AppError("conflict", "The file has not been uploaded yet.");
  if (capture.status === "queued" || capture.status === "running") throw new AppError("conflict", "The analysis is already running.");
  if (!capture.limitSetKey) throw new AppError("conflict", "Save the mapping and choose a limit set first.");
  if (capture.reviewState === "in_review") throw new AppError("conflict", "The capture is in review; its set-up and result are frozen until an engineer approves or sends it back.");
  throw new AppError("forbidden", "The capture is approved: only an engineer may analyse it again, and the new result needs a new review.");
}

/** Records a confirmed upload (size and SHA-256 computed by the server); false when it was already confirmed. */
export async function markUploaded({ id, sizeBytes, sha256, actorId }: { id: string; sizeBytes: number; sha256: string; actorId: string }): Promise<boolean> {
  return db.transaction(async (tx) => {
    const [row] = await tx
      .update(captures)
      .set({ status: "uploaded", sizeBytes, sha256, updatedAt: new Date() })
      .where(and(eq(captures.id, id), eq(captures.status, "uploading")))
      .returning({ id: captures.id });
    if (!row) return false;
    await insertAuditEvent(tx, { actorId, action: "capture.upload_confirmed", entityType: "capture", entityId: id, details: { sizeBytes, sha256 } });
    return true;
  });
}

/** Withdraws a capture before submission (its uploader only): hidden from lists, kept with an audit event. */
export async function withdrawCapture({ id, actorId, reader }: { id: string; actorId: string; reader: Reader }): Promise<void> {
  await db.transaction(async (tx) => {
    const [capture] = await tx.select().from(captures).where(and(eq(captures.id, id), capturesVisibleTo(reader))).for("update");
    if (!capture) throw new AppError("not_found", "No such capture.");
    if (capture.reviewState !== "draft") throw new AppError("conflict", "A capture that was submitted for review cannot be withdrawn.");
    if (capture.status === "queued" || capture.status === "running") throw new AppError("conflict", "The analysis is running; wait for it to finish before withdrawing.");
    if (capture.uploadedBy !== actorId) throw new AppError("forbidden", "Only the person who uploaded a capture can withdraw it.");
    await tx.update(captures).set({ withdrawnAt: new Date(), updatedAt: new Date() }).where(eq(captures.id, id));
    await insertAuditEvent(tx, { actorId, action: "capture.withdraw", entityType: "capture", entityId: id, details: { title: capture.title } });
  });
}

/** Switches between waveform record and interval log while nothing has been analysed; the mapping is cleared. */
export async function switchCaptureKind({ id, kind, actorId, reader }: { id: string; kind: Capture["kind"]; actorId: string; reader: Reader }): Promise<Capture> {
  return db.transaction(async (tx) => {
    const [capture] = await tx.select().from(captures).where(and(eq(captures.id, id), capturesVisibleTo(reader))).for("update");
    if (!capture) throw new AppError("not_found", "No such capture.");
    const [analysed] = await tx.select({ id: analyses.id }).from(analyses).where(eq(analyses.captureId, id)).limit(1);
    if (analysed || !["uploading", "uploaded", "failed"].includes(capture.status)) {
      throw new AppError("conflict", "The kind can only be switched before the capture is analysed.");
    }
    if (capture.kind === kind) return capture;
    const [updated] = await tx.update(captures).set({ kind, mapping: null, updatedAt: new Date() }).where(eq(captures.id, id)).returning();
    await insertAuditEvent(tx, { actorId, action: "capture.kind", entityType: "capture", entityId: id, details: { from: capture.kind, to: kind } });
    return updated!;
  });
}

/** Captures still "uploading" that were registered before `before`. */
export async function listAbandonedUploads({ before }: { before: Date }): Promise<Pick<Capture, "id" | "s3Key">[]> {
  return db.select({ id: captures.id, s3Key: captures.s3Key }).from(captures).where(and(eq(captures.status, "uploading"), lt(captures.createdAt, before)));
}

/** Deletes an abandoned upload's row (only if it is still uploading and old), with an audit event. */
export async function deleteAbandonedCapture({ id, before }: { id: string; before: Date }): Promise<boolean> {
  return db.transaction(async (tx) => {
    const [gone] = await tx
      .delete(captures)
      .where(and(eq(captures.id, id), eq(captures.status, "uploading"), lt(captures.createdAt, before)))
      .returning({ id: captures.id, title: captures.title, uploadedBy: captures.uploadedBy });
    if (!gone) return false;
    await insertAuditEvent(tx, { actorId: null, action: "capture.upload_abandoned_removed", entityType: "capture", entityId: id, details: { title: gone.title, uploadedBy: gone.uploadedBy } });
    return true;
  });
}

export async function setCapturedAt({ id, capturedAt }: { id: string; capturedAt: Date }): Promise<void> {
  await db.update(captures).set({ capturedAt }).where(eq(captures.id, id));
}

/** Checks the chosen limit set exists, then locks the capture row for a set-up save (visible and still editable by this reader). */
async function lockSetupEditable(tx: Tx, { id, limitSetKey, reader }: { id: string; limitSetKey: string; reader: Reader }): Promise<void> {
  const [set] = await tx.select({ id: limitSets.id }).from(limitSets).where(eq(limitSets.key, limitSetKey));
  if (!set) throw new AppError("validation", "Choose a limit set", { limitSetKey: ["No such limit set"] });
  const [current] = await tx.select().from(captures).where(and(eq(captures.id, id), capturesVisibleTo(reader))).for("update");
  if (!current) throw new AppError("not_found", "No such capture.");
  assertSetupEditable(current, reader);
}

export async function saveCaptureSetup({ id, setup, actorId, reader }: { id: string; setup: CaptureSetup; actorId: string; reader: Reader }): Promise<Capture> {
  return db.transaction(async (tx) => {
    await lockSetupEditable(tx, { id, limitSetKey: setup.limitSetKey, reader });
    const [capture] = await tx
      .update(captures)
      .set({ mapping: setup.mapping, context: setup.context, limitSetKey: setup.limitSetKey, setupBy: actorId, updatedAt: new Date() })
      .where(eq(captures.id, id))
      .returning();
    if (!capture) throw new AppError("not_found", "No such capture.");
    await insertAuditEvent(tx, { actorId, action: "capture.setup", entityType: "capture", entityId: id, details: { ...setup } });
    return capture;
  });
}

/** Saves an interval log's column mapping, limit set and context, and remembers the mapping on its site. */
export async function saveIntervalSetup({ id, setup, actorId, reader }: { id: string; setup: IntervalSetup; actorId: string; reader: Reader }): Promise<Capture> {
  return db.transaction(async (tx) => {
    await lockSetupEditable(tx, { id, limitSetKey: setup.limitSetKey, reader });
    const [capture] = await tx
      .update(captures)
      .set({ mapping: { intervalMapping: setup.intervalMapping }, context: setup.context, limitSetKey: setup.limitSetKey, setupBy: actorId, updatedAt: new Date() })
      .where(and(eq(captures.id, id), eq(captures.kind, "interval-log")))
      .returning();
    if (!capture) throw new AppError("not_found", "No such interval log.");
    await tx.update(sites).set({ intervalMapping: setup.intervalMapping }).where(eq(sites.id, capture.siteId));
    await insertAuditEvent(tx, { actorId, action: "capture.interval_setup", entityType: "capture", entityId: id, details: { limitSetKey: setup.limitSetKey } });
    return capture;
  });
}

/** The current revision of a limit set, with its content validated. */
export async function getCurrentRevision({ key }: { key: string }): Promise<{
  key: string;
  name: string;
  revisionId: string;
  revisionNumber: number;
  content: LimitSetRevisionContent;
}> {
  const [row] = await db
    .select({ key: limitSets.key, name: limitSets.name, revisionId: limitSetRevisions.id, revisionNumber: limitSetRevisions.number, content: limitSetRevisions.content })
    .from(limitSets)
    .innerJoin(limitSetRevisions, eq(limitSetRevisions.id, limitSets.currentRevisionId))
    .where(eq(limitSets.key, key));
  if (!row) throw new AppError("not_found", `No limit set with key ${key}.`);
  return { ...row, content: LimitSetRevisionContentSchema.parse(row.content) };
}

export async function listLimitSetChoices(): Promise<{ key: string; name: string }[]> {
  return db.select({ key: limitSets.key, name: limitSets.name }).from(limitSets).orderBy(limitSets.key);
}

/** Stores an analysis and its first evaluation, and marks the capture done, in one transaction. */
export async function storeAnalysisResult({
  captureId,
  analysis,
  waveform,
  trends,
  evaluation,
  actorId,
  setup,
}: {
  captureId: string;
  analysis: AnalysisResult;
  waveform: Waveform | null;
  trends?: IntervalTrend[];
  evaluation: { revisionId: string; context: EvaluationContext; result: ComplianceResult };
  actorId: string | null;
  /** The set-up the run used, who saved it, and the SHA-256 of the file it read. */
  setup?: { setup: Record<string, unknown>; setupBy: string | null; fileSha256: string | null };
}): Promise<{ analysisId: string; evaluationId: string }> {
  return db.transaction(async (tx) => {
    const [a] = await tx
      .insert(analyses)
      .values({
        captureId,
        result: analysis,
        summary: analysisSummary(analysis),
        waveform,
        trends: trends ?? null,
        createdBy: actorId,
        setup: setup?.setup ?? null,
        setupBy: setup?.setupBy ?? null,
        fileSha256: setup?.fileSha256 ?? null,
      })
      .returning({ id: analyses.id });
    const [e] = await tx
      .insert(evaluations)
      .values({
        captureId,
        analysisId: a!.id,
        limitSetRevisionId: evaluation.revisionId,
        context: evaluation.context,
        result: evaluation.result,
        verdict: evaluation.result.verdict,
        ...chartColumns(buildChartData({ analysis, waveform, trends: trends ?? null, evaluation: evaluation.result })),
        createdBy: actorId,
      })
      .returning({ id: evaluations.id });
    await insertSheetParts({ evaluationId: e!.id, result: evaluation.result }, tx);
    await tx
      .update(captures)
      .set({ status: "done", progressPercent: 100, failureReason: null, updatedAt: new Date() })
      .where(eq(captures.id, captureId));
    await onNewResult(tx, captureId);
    await insertAuditEvent(tx, { actorId, action: "capture.analysed", entityType: "capture", entityId: captureId, details: { verdict: evaluation.result.verdict, evaluationId: e!.id } });
    return { analysisId: a!.id, evaluationId: e!.id };
  });
}

export async function latestAnalysis({ captureId }: { captureId: string }) {
  const [a] = await db.select().from(analyses).where(eq(analyses.captureId, captureId)).orderBy(desc(analyses.createdAt)).limit(1);
  return a ?? null;
}

export async function insertEvaluation({
  captureId,
  analysisId,
  revisionId,
  context,
  result,
  actorId,
}: {
  captureId: string;
  analysisId: string;
  revisionId: string;
  context: EvaluationContext;
  result: ComplianceResult;
  actorId: string;
}): Promise<string> {
  return db.transaction(async (tx) => {
    const [a] = await tx.select({ result: analyses.result, waveform: analyses.waveform, trends: analyses.trends }).from(analyses).where(eq(analyses.id, analysisId));
    const charts = a ? buildChartData({ analysis: a.result, waveform: a.waveform ?? null, trends: a.trends ?? null, evaluation: result }) : null;
    const [e] = await tx
      .insert(evaluations)
      .values({ captureId, analysisId, limitSetRevisionId: revisionId, context, result, verdict: result.verdict, ...chartColumns(charts), createdBy: actorId })
      .returning({ id: evaluations.id });
    await insertSheetParts({ evaluationId: e!.id, result }, tx);
    await onNewResult(tx, captureId);
    await insertAuditEvent(tx, { actorId, action: "capture.reevaluate", entityType: "capture", entityId: captureId, details: { evaluationId: e!.id } });
    return e!.id;
  });
}

export interface EvaluationSummary {
  id: string;
  createdAt: Date;
  verdict: string;
  limitSetKey: string;
  limitSetName: string;
  revisionNumber: number;
  revisionId: string;
  context: Record<string, unknown>;
  createdByName: string | null;
}

export async function listEvaluations({ captureId, onlyId }: { captureId: string; onlyId?: string | null }): Promise<EvaluationSummary[]> {
  // A reader restricted to one evaluation that does not exist (nothing approved) gets none.
  if (onlyId === null) return [];
  return db
    .select({
      id: evaluations.id,
      createdAt: evaluations.createdAt,
      verdict: evaluations.verdict,
      limitSetKey: limitSets.key,
      limitSetName: limitSets.name,
      revisionNumber: limitSetRevisions.number,
      revisionId: limitSetRevisions.id,
      context: evaluations.context,
      createdByName: users.name,
    })
    .from(evaluations)
    .innerJoin(limitSetRevisions, eq(limitSetRevisions.id, evaluations.limitSetRevisionId))
    .innerJoin(limitSets, eq(limitSets.id, limitSetRevisions.limitSetId))
    .leftJoin(users, eq(users.id, evaluations.createdBy))
    .where(and(eq(evaluations.captureId, captureId), onlyId !== undefined ? eq(evaluations.id, onlyId) : undefined))
    .orderBy(desc(evaluations.createdAt));
}

/** An evaluation's chart columns: the data, and the same JSON gzipped as the charts route sends it. */
function chartColumns(charts: ChartData | null): { charts: ChartData | null; chartsGzip: Buffer | null } {
  return { charts, chartsGzip: charts ? storedGzip(charts) : null };
}

/**
 * Stores chart data computed late for an older evaluation (or only its gzipped form, `text` being the
 * stored JSON), so the next request reads it. Returns the gzipped bytes.
 */
export async function saveEvaluationCharts({ evaluationId, charts }: { evaluationId: string; charts: ChartData | { text: string } }): Promise<Buffer> {
  if ("text" in charts) {
    const gzip = storedGzip(charts.text);
    await db.update(evaluations).set({ chartsGzip: gzip }).where(eq(evaluations.id, evaluationId));
    return gzip;
  }
  const columns = chartColumns(charts);
  await db.update(evaluations).set(columns).where(eq(evaluations.id, evaluationId));
  return columns.chartsGzip!;
}

export async function getEvaluation({ captureId, evaluationId }: { captureId: string; evaluationId?: string }) {
  const [row] = await db
    .select()
    .from(evaluations)
    .where(and(eq(evaluations.captureId, captureId), evaluationId ? eq(evaluations.id, evaluationId) : undefined))
    .orderBy(desc(evaluations.createdAt))
    .limit(1);
  return row ?? null;
}

export async function listReviewEvents({ captureId }: { captureId: string }) {
  return db
    .select({ id: reviewEvents.id, action: reviewEvents.action, comment: reviewEvents.comment, createdAt: reviewEvents.createdAt, actorName: users.name, actorRole: users.role })
    .from(reviewEvents)
    .leftJoin(users, eq(users.id, reviewEvents.actorId))
    .where(eq(reviewEvents.captureId, captureId))
    .orderBy(reviewEvents.createdAt);
}

/**
 * Records a review decision through the state machine (lib/reviews/review-transition.ts).
 * A decision is bound to one evaluation: approving names the evaluation the engineer looked at,
 * which must be the newest one, and the approver must not have set up, run or judged it.
 */
export async function recordReview({
  captureId,
  action,
  comment,
  actorId,
  evaluationId,
}: {
  captureId: string;
  action: Exclude<ReviewEvent, "new_result">;
  comment: string;
  actorId: string;
  evaluationId?: string;
}): Promise<Capture> {
  return db.transaction(async (tx) => {
    const [capture] = await tx.select().from(captures).where(and(eq(captures.id, captureId), isNull(captures.withdrawnAt))).for("update");
    if (!capture) throw new AppError("not_found", "No such capture.");
    const t = reviewTransition(capture.reviewState, action);
    if (!t.ok) throw refuseTransition(capture.reviewState, action, t.allowed);
    if (action !== "comment" && capture.status !== "done") {
      throw new AppError("conflict", "Only an analysed capture can be submitted, approved or sent back (an analysis is queued, running or failed).");
    }
    const [latest] = await tx.select().from(evaluations).where(eq(evaluations.captureId, captureId)).orderBy(desc(evaluations.createdAt)).limit(1);
    if (action !== "comment" && !latest) throw new AppError("conflict", "The capture has not been evaluated yet.");
    if (action === "approved") {
      if (!evaluationId) throw new AppError("validation", "Name the evaluation you approve", { evaluationId: ["Required to approve"] });
      if (evaluationId !== latest!.id) throw new AppError("conflict", "A newer result exists than the one you approved; open the sheet again and review the newest result.");
      const [analysis] = await tx.select({ createdBy: analyses.createdBy, setupBy: analyses.setupBy }).from(analyses).where(eq(analyses.id, latest!.analysisId));
      const parts = fourEyesConflict({ approverId: actorId, setupBy: analysis?.setupBy ?? capture.setupBy, analysedBy: analysis?.createdBy ?? null, evaluatedBy: latest!.createdBy });
      if (parts.length > 0) {
        throw new AppError("forbidden", `You made the ${parts.join(", ")} of this result; another engineer must approve it (four-eyes rule).`);
      }
    }
    await tx.insert(reviewEvents).values({ captureId, evaluationId: latest?.id ?? null, actorId, action, comment });
    const [updated] = await tx
      .update(captures)
      .set({ reviewState: t.next, updatedAt: new Date(), ...(action === "approved" ? { approvedEvaluationId: latest!.id } : {}) })
      .where(eq(captures.id, captureId))
      .returning();
    await insertAuditEvent(tx, { actorId, action: `capture.review.${action}`, entityType: "capture", entityId: captureId, details: { comment, evaluationId: latest?.id ?? null } });
    return updated!;
  });
}

/** The approval behind a capture's approved evaluation: who, when, with what comment. */
export async function getApproval({ captureId, evaluationId }: { captureId: string; evaluationId: string | null }) {
  if (!evaluationId) return null;
  const [row] = await db
    .select({ evaluationId: reviewEvents.evaluationId, createdAt: reviewEvents.createdAt, comment: reviewEvents.comment, actorName: users.name })
    .from(reviewEvents)
    .leftJoin(users, eq(users.id, reviewEvents.actorId))
    .where(and(eq(reviewEvents.captureId, captureId), eq(reviewEvents.evaluationId, evaluationId), eq(reviewEvents.action, "approved")))
    .orderBy(desc(reviewEvents.createdAt))
    .limit(1);
  return row ?? null;
}

export async function getAnalysisById({ id }: { id: string }) {
  const [a] = await db.select().from(analyses).where(eq(analyses.id, id));
  return a ?? null;
}

/** Active engineers, who are told when a capture is submitted for review. */
export async function listReviewerContacts(): Promise<{ email: string; name: string }[]> {
  return db.select({ email: users.email, name: users.name }).from(users).where(and(eq(users.role, "engineer"), eq(users.active, true)));
}

export async function getUserContact({ id }: { id: string | null }) {
  if (!id) return null;
  const [u] = await db.select({ email: users.email, name: users.name }).from(users).where(eq(users.id, id));
  return u ?? null;
}

export interface CaptureListItem {
  id: string;
  title: string;
  siteId: string;
  siteName: string;
  status: Capture["status"];
  reviewState: Capture["reviewState"];
  verdict: string | null;
  /** True when the verdict shown is an approved evaluation's. */
  approved: boolean;
  /** An analysis or evaluation newer than the approved one waits for review. */
  newerAwaitsReview: boolean;
  /** The verdict of the approved evaluation (null when never approved). */
  approvedVerdict: string | null;
  /** The newest evaluation's verdict, whether approved or not. */
  latestVerdict: string | null;
  createdAt: Date;
  uploadedByName: string | null;
}

/** Server-side filtered, paginated list; the verdict is the approved evaluation's while one exists, else the newest one's. */
export async function listCaptures({ query, reader }: { query: CaptureListQuery; reader: Reader }): Promise<{ items: CaptureListItem[]; total: number; page: number; pages: number }> {
  const latestId = dsql`(select e.id from ${evaluations} e where e.capture_id = ${captures.id} order by e.created_at desc limit 1)`;
  const newestVerdict = dsql<string | null>`(select e.verdict from ${evaluations} e where e.capture_id = ${captures.id} order by e.created_at desc limit 1)`;
  const approvedVerdict = dsql<string | null>`(select e.verdict from ${evaluations} e where e.id = ${captures.approvedEvaluationId})`;
  const latestVerdict = dsql<string | null>`coalesce(${approvedVerdict}, ${newestVerdict})`;
  const newer = dsql<boolean>`(${captures.approvedEvaluationId} is not null and ${captures.approvedEvaluationId} is distinct from ${latestId})`;
  // Outside readers learn nothing of results that are not approved: no newest verdict, no "newer result awaits review".
  const outside = readsApprovedResultOnly(reader);
  const where = and(
    capturesVisibleTo(reader),
    query.site ? eq(captures.siteId, query.site) : undefined,
    query.status ? eq(captures.status, query.status) : undefined,
    query.verdict ? dsql`${latestVerdict} = ${query.verdict}` : undefined,
    query.from ? gte(captures.createdAt, new Date(`${query.from}T00:00:00Z`)) : undefined,
    query.to ? lt(captures.createdAt, new Date(new Date(`${query.to}T00:00:00Z`).getTime() + 86_400_000)) : undefined,
  );
  const [{ total } = { total: 0 }] = await db.select({ total: count() }).from(captures).where(where);
  const pages = Math.max(1, Math.ceil(total / capturesPerPage));
  const page = Math.min(query.page, pages);
  const items = await db
    .select({
      id: captures.id,
      title: captures.title,
      siteId: captures.siteId,
      siteName: sites.name,
      status: captures.status,
      reviewState: captures.reviewState,
      verdict: latestVerdict,
      approved: dsql<boolean>`(${captures.approvedEvaluationId} is not null)`,
      newerAwaitsReview: outside ? dsql<boolean>`false` : newer,
      approvedVerdict,
      latestVerdict: outside ? approvedVerdict : newestVerdict,
      createdAt: captures.createdAt,
      uploadedByName: users.name,
    })
    .from(captures)
    .innerJoin(sites, eq(sites.id, captures.siteId))
    .leftJoin(users, eq(users.id, captures.uploadedBy))
    .where(where)
    .orderBy(desc(captures.createdAt))
    .limit(capturesPerPage)
    .offset((page - 1) * capturesPerPage);
  return { items, total, page, pages };
}

export async function createShareLink({
  captureId,
  tokenHash,
  label,
  expiresAt,
  actorId,
}: {
  captureId: string;
  tokenHash: string;
  label: string;
  expiresAt: Date;
  actorId: string;
}) {
  return db.transaction(async (tx) => {
    const [link] = await tx.insert(shareLinks).values({ captureId, tokenHash, label, expiresAt, createdBy: actorId }).returning();
    await insertAuditEvent(tx, { actorId, action: "capture.share", entityType: "capture", entityId: captureId, details: { shareId: link!.id, label } });
    return link!;
  });
}

export async function listShareLinks({ captureId }: { captureId: string }) {
  return db.select().from(shareLinks).where(eq(shareLinks.captureId, captureId)).orderBy(desc(shareLinks.createdAt));
}

export async function revokeShareLink({ captureId, shareId, actorId }: { captureId: string; shareId: string; actorId: string }) {
  return db.transaction(async (tx) => {
    const [link] = await tx
      .update(shareLinks)
      .set({ revokedAt: new Date() })
      .where(and(eq(shareLinks.id, shareId), eq(shareLinks.captureId, captureId)))
      .returning();
    if (!link) throw new AppError("not_found", "No such share link.");
    await insertAuditEvent(tx, { actorId, action: "capture.share.revoke", entityType: "capture", entityId: captureId, details: { shareId } });
    return link;
  });
}

/** A live share link: the capture it opens and when it stops working; null when unknown, revoked or expired. */
export async function findShareLink({ tokenHash }: { tokenHash: string }): Promise<{ capture: Capture; expiresAt: Date } | null> {
  const [row] = await db
    .select({ capture: captures, expiresAt: shareLinks.expiresAt })
    .from(shareLinks)
    .innerJoin(captures, eq(captures.id, shareLinks.captureId))
    .where(and(eq(shareLinks.tokenHash, tokenHash), dsql`${shareLinks.revokedAt} is null`, gte(shareLinks.expiresAt, new Date()), isNull(captures.withdrawnAt)));
  return row ?? null;
}
