import "server-only";
import { and, count, desc, eq, gte, lt, sql as dsql } from "drizzle-orm";
import { db } from "@/db/client";
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
import type { Reader } from "@/lib/auth/permissions";
import type { EvaluationContext, LimitSetRevisionContent } from "@/lib/compliance/model";
import { LimitSetRevisionContentSchema } from "@/lib/compliance/model";
import type { ComplianceResult } from "@/lib/compliance/result";
import { AppError } from "@/lib/errors";
import type { IntervalTrend } from "@/lib/intervals/evaluate-interval-log";
import { buildChartData, type ChartData } from "@/lib/reports/chart-data";
import type { HeadlineSource } from "@/lib/reports/headline-numbers";
import type { Waveform } from "@/lib/pipeline/run-capture";
import type { CaptureListQuery, CaptureSetup, IntervalSetup, RegisterCaptureInput } from "@/lib/validations/capture";
import { insertAuditEvent } from "./audit";
import { capturesVisibleTo } from "./scope";

export const capturesPerPage = 20;

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
}: {
  id: string;
  status: Capture["status"];
  progressPercent?: number;
  failureReason?: string | null;
  sizeBytes?: number;
}): Promise<void> {
  await db
    .update(captures)
    .set({
      status,
      updatedAt: new Date(),
      ...(progressPercent !== undefined ? { progressPercent } : {}),
      ...(failureReason !== undefined ? { failureReason } : {}),
      ...(sizeBytes !== undefined ? { sizeBytes } : {}),
    })
    .where(eq(captures.id, id));
}

export async function setCapturedAt({ id, capturedAt }: { id: string; capturedAt: Date }): Promise<void> {
  await db.update(captures).set({ capturedAt }).where(eq(captures.id, id));
}

export async function saveCaptureSetup({ id, setup, actorId }: { id: string; setup: CaptureSetup; actorId: string }): Promise<Capture> {
  return db.transaction(async (tx) => {
    const [set] = await tx.select({ id: limitSets.id }).from(limitSets).where(eq(limitSets.key, setup.limitSetKey));
    if (!set) throw new AppError("validation", "Choose a limit set", { limitSetKey: ["No such limit set"] });
    const [capture] = await tx
      .update(captures)
      .set({ mapping: setup.mapping, context: setup.context, limitSetKey: setup.limitSetKey, updatedAt: new Date() })
      .where(eq(captures.id, id))
      .returning();
    if (!capture) throw new AppError("not_found", "No such capture.");
    await insertAuditEvent(tx, { actorId, action: "capture.setup", entityType: "capture", entityId: id, details: { ...setup } });
    return capture;
  });
}

/** Saves an interval log's column mapping, limit set and context, and remembers the mapping on its site. */
export async function saveIntervalSetup({ id, setup, actorId }: { id: string; setup: IntervalSetup; actorId: string }): Promise<Capture> {
  return db.transaction(async (tx) => {
    const [set] = await tx.select({ id: limitSets.id }).from(limitSets).where(eq(limitSets.key, setup.limitSetKey));
    if (!set) throw new AppError("validation", "Choose a limit set", { limitSetKey: ["No such limit set"] });
    const [capture] = await tx
      .update(captures)
      .set({ mapping: { intervalMapping: setup.intervalMapping }, context: setup.context, limitSetKey: setup.limitSetKey, updatedAt: new Date() })
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
}: {
  captureId: string;
  analysis: AnalysisResult;
  waveform: Waveform | null;
  trends?: IntervalTrend[];
  evaluation: { revisionId: string; context: EvaluationContext; result: ComplianceResult };
  actorId: string | null;
}): Promise<{ analysisId: string; evaluationId: string }> {
  return db.transaction(async (tx) => {
    const [a] = await tx.insert(analyses).values({ captureId, result: analysis, waveform, trends: trends ?? null, createdBy: actorId }).returning({ id: analyses.id });
    const [e] = await tx
      .insert(evaluations)
      .values({
        captureId,
        analysisId: a!.id,
        limitSetRevisionId: evaluation.revisionId,
        context: evaluation.context,
        result: evaluation.result,
        verdict: evaluation.result.verdict,
        charts: buildChartData({ analysis, waveform, trends: trends ?? null, evaluation: evaluation.result }),
        createdBy: actorId,
      })
      .returning({ id: evaluations.id });
    await tx
      .update(captures)
      .set({ status: "done", progressPercent: 100, failureReason: null, updatedAt: new Date() })
      .where(eq(captures.id, captureId));
    await insertAuditEvent(tx, { actorId, action: "capture.analysed", entityType: "capture", entityId: captureId, details: { verdict: evaluation.result.verdict } });
    return { analysisId: a!.id, evaluationId: e!.id };
  });
}

/**
 * The newest analysis without its per-order and per-window arrays (built in PostgreSQL, so the large
 * document never leaves the database): what the sheet, PDF and CSV need for the headline numbers.
 */
export async function latestAnalysisSummary({ captureId }: { captureId: string }): Promise<{ id: string; createdAt: Date; result: HeadlineSource } | null> {
  const r = analyses.result;
  const slim = dsql<HeadlineSource>`jsonb_build_object(
    'fundamentalHz', ${r}->'fundamentalHz',
    'power', ${r}->'power',
    'sequence', coalesce((select jsonb_agg(s.v - 'orders' order by s.i) from jsonb_array_elements(coalesce(${r}->'sequence', '[]'::jsonb)) with ordinality as s(v, i)), '[]'::jsonb),
    'channels', coalesce((select jsonb_agg(c.v - 'harmonics' - 'series' - 'harmonicSeries' - 'groups' order by c.i) from jsonb_array_elements(${r}->'channels') with ordinality as c(v, i)), '[]'::jsonb)
  )`;
  const [a] = await db
    .select({ id: analyses.id, createdAt: analyses.createdAt, result: slim })
    .from(analyses)
    .where(eq(analyses.captureId, captureId))
    .orderBy(desc(analyses.createdAt))
    .limit(1);
  return a ?? null;
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
      .values({ captureId, analysisId, limitSetRevisionId: revisionId, context, result, verdict: result.verdict, charts, createdBy: actorId })
      .returning({ id: evaluations.id });
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

export async function listEvaluations({ captureId }: { captureId: string }): Promise<EvaluationSummary[]> {
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
    .where(eq(evaluations.captureId, captureId))
    .orderBy(desc(evaluations.createdAt));
}

/**
 * The precomputed chart data of an evaluation of a capture (the newest when no id is given), with its id.
 * `charts` is null for evaluations stored before the data was precomputed. Reads one row, no analysis.
 */
export async function getEvaluationCharts({ captureId, evaluationId }: { captureId: string; evaluationId?: string }) {
  const [row] = await db
    .select({ id: evaluations.id, analysisId: evaluations.analysisId, charts: evaluations.charts })
    .from(evaluations)
    .where(and(eq(evaluations.captureId, captureId), evaluationId ? eq(evaluations.id, evaluationId) : undefined))
    .orderBy(desc(evaluations.createdAt))
    .limit(1);
  return row ?? null;
}

/** Stores chart data computed late for an older evaluation, so the next request reads it. */
export async function saveEvaluationCharts({ evaluationId, charts }: { evaluationId: string; charts: ChartData }): Promise<void> {
  await db.update(evaluations).set({ charts }).where(eq(evaluations.id, evaluationId));
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

const nextState = { submitted: "in_review", approved: "approved", sent_back: "sent_back", comment: null } as const;

export async function recordReview({
  captureId,
  action,
  comment,
  actorId,
}: {
  captureId: string;
  action: keyof typeof nextState;
  comment: string;
  actorId: string;
}): Promise<Capture> {
  return db.transaction(async (tx) => {
    const [capture] = await tx.select().from(captures).where(eq(captures.id, captureId)).for("update");
    if (!capture) throw new AppError("not_found", "No such capture.");
    if (action !== "comment" && capture.status !== "done") {
      throw new AppError("conflict", "Only an analysed capture can be submitted, approved or sent back.");
    }
    const [latest] = await tx.select({ id: evaluations.id }).from(evaluations).where(eq(evaluations.captureId, captureId)).orderBy(desc(evaluations.createdAt)).limit(1);
    await tx.insert(reviewEvents).values({ captureId, evaluationId: latest?.id ?? null, actorId, action, comment });
    const state = nextState[action];
    const [updated] = state
      ? await tx.update(captures).set({ reviewState: state, updatedAt: new Date() }).where(eq(captures.id, captureId)).returning()
      : [capture];
    await insertAuditEvent(tx, { actorId, action: `capture.review.${action}`, entityType: "capture", entityId: captureId, details: { comment } });
    return updated!;
  });
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
  /** The verdict of the evaluation an engineer last approved (null when never approved). */
  approvedVerdict: string | null;
  createdAt: Date;
  uploadedByName: string | null;
}

/** Server-side filtered, paginated list; the verdict is the newest evaluation's. */
export async function listCaptures({ query, reader }: { query: CaptureListQuery; reader: Reader }): Promise<{ items: CaptureListItem[]; total: number; page: number; pages: number }> {
  const latestVerdict = dsql<string | null>`(select e.verdict from ${evaluations} e where e.capture_id = ${captures.id} order by e.created_at desc limit 1)`;
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
      approvedVerdict: dsql<string | null>`(select e.verdict from ${reviewEvents} r join ${evaluations} e on e.id = r.evaluation_id where r.capture_id = ${captures.id} and r.action = 'approved' order by r.created_at desc limit 1)`,
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
    .where(and(eq(shareLinks.tokenHash, tokenHash), dsql`${shareLinks.revokedAt} is null`, gte(shareLinks.expiresAt, new Date())));
  return row ?? null;
}
