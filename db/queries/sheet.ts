import "server-only";
import { and, desc, eq, sql as dsql } from "drizzle-orm";
import { db, type Db, type Tx } from "@/db/client";
import { analyses, captures, evaluationSheetBodies, evaluationSheetParts, evaluations, limitSetVerifications, sites, users, type Capture, type Site } from "@/db/schema";
import type { Reader } from "@/lib/auth/permissions";
import type { ChannelCompliance, ComplianceResult } from "@/lib/compliance/result";
import { AppError } from "@/lib/errors";
import type { AnalysisSummary } from "@/lib/reports/analysis-summary";
import { splitResult, type ResultHead } from "@/lib/reports/result-head";
import { sheetBodyData } from "@/lib/reports/sheet-body-data";
import { storedGzip } from "@/lib/reports/stored-gzip";
import { captureViewColumns, type CaptureView } from "./capture-view";
import { verificationColumns, type VerificationView } from "./limit-verifications";
import { capturesVisibleTo, sitesVisibleTo } from "./scope";

// The reads behind a sheet (page, share page, PDF, CSV) and its charts: few queries, each reading only
// what is shown. Visibility is the same filter every capture query uses (db/queries/scope.ts).

/**
 * One capture as `reader` may see it, with its site and the uploader's name, in one query; not found
 * otherwise (the same rule as getCaptureById, and the site must be one the reader may see).
 */
export async function getSheetCapture({ id, reader }: { id: string; reader: Reader }): Promise<{ capture: Capture; site: Site; uploaderName: string | null }> {
  const [row] = await db
    .select({ capture: captures, site: sites, uploaderName: users.name })
    .from(captures)
    .innerJoin(sites, eq(sites.id, captures.siteId))
    .leftJoin(users, eq(users.id, captures.uploadedBy))
    .where(and(eq(captures.id, id), capturesVisibleTo(reader), sitesVisibleTo(reader)));
  if (!row) throw new AppError("not_found", "No such capture.");
  return row;
}

/**
 * The analysis summary for analyses stored before it was written with them: the same projection as
 * lib/reports/analysis-summary.ts, built in PostgreSQL so the whole document never leaves the database.
 */
function summaryOf(r: typeof analyses.result) {
  return dsql<AnalysisSummary>`coalesce(${analyses.summary}, jsonb_build_object(
    'fundamentalHz', ${r}->'fundamentalHz',
    'sampleIntervalS', ${r}->'sampleIntervalS',
    'power', ${r}->'power',
    'intervalLog', ${r}->'intervalLog',
    'sequence', coalesce((select jsonb_agg(s.v - 'orders' order by s.i) from jsonb_array_elements(coalesce(${r}->'sequence', '[]'::jsonb)) with ordinality as s(v, i)), '[]'::jsonb),
    'channels', coalesce((select jsonb_agg(c.v - 'harmonics' - 'series' - 'harmonicSeries' - 'groups' order by c.i) from jsonb_array_elements(${r}->'channels') with ordinality as c(v, i)), '[]'::jsonb)
  )::json)`;
}

/** The newest verification of the evaluation's limit-set revision (a lateral subquery of a query on evaluations). */
function newestVerification() {
  return db
    .select(verificationColumns)
    .from(limitSetVerifications)
    .where(eq(limitSetVerifications.revisionId, evaluations.limitSetRevisionId))
    .orderBy(desc(limitSetVerifications.createdAt))
    .limit(1)
    .as("verification");
}

/** What to read of an evaluation besides its analysis summary and verification. */
interface EvaluationReads {
  /** The whole result (PDF, CSV, comparison). */
  result?: boolean;
  /** The sheet page's parts: the head, and the channel of that name (the first, worst one for any other name); null: no channel. */
  parts?: { channel: string | null };
}

/**
 * One evaluation of a capture (by id, else the newest) with, in the same query, the summary of the analysis
 * behind it, the newest verification of the limit-set revision it was judged against, and what `read` asks.
 */
async function readEvaluation({ captureId, evaluationId, read }: { captureId: string; evaluationId?: string; read: EvaluationReads }) {
  const verification = newestVerification();
  const none = dsql<null>`null`;
  const channel = read.parts?.channel;
  const [row] = await db
    .select({
      id: evaluations.id,
      result: read.result ? dsql<ComplianceResult>`${evaluations.result}` : none,
      head: read.parts ? dsql<ResultHead | null>`(select p.data from ${evaluationSheetParts} p where p.evaluation_id = ${evaluations.id} and p.part = 0)` : none,
      shown:
        read.parts && channel !== null
          ? dsql<ChannelCompliance | null>`(select p.data from ${evaluationSheetParts} p where p.evaluation_id = ${evaluations.id} and p.part > 0 order by (p.channel = ${channel}) desc, p.part limit 1)`
          : none,
      analysis: { id: analyses.id, createdAt: analyses.createdAt, result: summaryOf(analyses.result), setup: analyses.setup, fileSha256: analyses.fileSha256 },
      verification: {
        edition: verification.edition,
        checked: verification.checked,
        verifiedByName: verification.verifiedByName,
        verifiedOn: verification.verifiedOn,
        note: verification.note,
        createdAt: verification.createdAt,
      },
    })
    .from(evaluations)
    .innerJoin(analyses, eq(analyses.id, evaluations.analysisId))
    .leftJoinLateral(verification, dsql`true`)
    .where(and(eq(evaluations.captureId, captureId), evaluationId ? eq(evaluations.id, evaluationId) : undefined))
    .orderBy(desc(evaluations.createdAt))
    .limit(1);
  if (!row) return null;
  const { analysis, verification: v, ...rest } = row;
  return {
    ...rest,
    analysis: { ...analysis, setup: (analysis.setup as Record<string, unknown> | null) ?? null, fileSha256: analysis.fileSha256 ?? null },
    // Null (or all-null columns) when the revision has not been verified.
    verification: v?.createdAt ? (v as VerificationView) : null,
  };
}

/**
 * The evaluation a sheet shows, whole (the PDF, the CSV, the comparison), by id or else the newest of the
 * capture, with its analysis summary and its revision's verification; its chart data is not read.
 * Null when the capture has no such evaluation.
 */
export async function getSheetEvaluation({ captureId, evaluationId }: { captureId: string; evaluationId?: string }) {
  const row = await readEvaluation({ captureId, evaluationId, read: { result: true } });
  return row ? { id: row.id, result: row.result as ComplianceResult, analysis: row.analysis, verification: row.verification } : null;
}

/**
 * Stores a result's sheet parts (lib/reports/result-head.ts) for an evaluation, and each channel part's
 * sheet body as the signed-in sheet's client loads it, gzipped; nothing where they exist.
 */
export async function insertSheetParts({ evaluationId, result }: { evaluationId: string; result: ComplianceResult }, tx: Tx | Db = db): Promise<void> {
  const { head, channels } = splitResult(result);
  await tx
    .insert(evaluationSheetParts)
    .values([{ evaluationId, part: 0, channel: null, data: head }, ...channels.map((c, i) => ({ evaluationId, part: i + 1, channel: c.channel, data: c }))])
    .onConflictDoNothing();
  if (channels.length > 0) {
    await tx
      .insert(evaluationSheetBodies)
      .values(channels.map((c, i) => ({ evaluationId, part: i + 1, gzip: sheetBodyGzip(head, c) })))
      .onConflictDoNothing();
  }
}

/** The sheet body of one channel as stored: `{ body }` (lib/reports/sheet-body-data.ts) as JSON, gzipped. */
export function sheetBodyGzip(head: ResultHead, channel: ChannelCompliance): Buffer {
  return storedGzip({ body: sheetBodyData(head, channel) });
}

/** Stores the sheet body of an evaluation stored before bodies were (once; it never changes). */
export async function insertSheetBody({ evaluationId, part, gzip }: { evaluationId: string; part: number; gzip: Buffer }): Promise<void> {
  await db.insert(evaluationSheetBodies).values({ evaluationId, part, gzip }).onConflictDoNothing();
}

/**
 * The evaluation the sheet page shows, as its head and one channel: the channel named `channel` (the
 * first, i.e. worst, one when it names none of them), or no channel at all when `channel` is null (the
 * "evaluation before" beside the shown one). Same evaluation choice, analysis summary and verification as
 * getSheetEvaluation. An evaluation stored before its parts were has them built from the whole result
 * and stored, once. Null when the capture has no such evaluation.
 */
export async function getSheetView({ captureId, evaluationId, channel }: { captureId: string; evaluationId?: string; channel: string | null | undefined }) {
  const row = await readEvaluation({ captureId, evaluationId, read: { parts: { channel: channel === null ? null : (channel ?? "") } } });
  if (!row) return null;
  const view = { id: row.id, analysis: row.analysis, verification: row.verification };
  if (row.head) return { ...view, head: row.head, channel: row.shown };
  // Stored before its parts were: split the whole result once, keep the parts for the next view.
  const [whole] = await db.select({ result: evaluations.result }).from(evaluations).where(eq(evaluations.id, row.id));
  const parts = splitResult(whole!.result);
  await insertSheetParts({ evaluationId: row.id, result: whole!.result });
  return { ...view, head: parts.head, channel: channel === null ? null : (parts.channels.find((c) => c.channel === channel) ?? parts.channels[0] ?? null) };
}

/**
 * The chart data of a capture's evaluation as stored with it, gzipped (`chartsGzip`; else, for an older
 * evaluation stored before that, the JSON text, never parsed here), in one query that also applies
 * `reader`'s visibility of the capture: the named evaluation, else the approved one while there is one,
 * else the newest. `null`: the capture is not visible (or does not exist); `evaluation: null`: it has no
 * such evaluation; both forms null: an older evaluation stored before chart data was.
 */
export async function getVisibleChartsJson({ captureId, reader, evaluationId }: { captureId: string; reader: Reader; evaluationId?: string }): Promise<{
  approvedEvaluationId: string | null;
  evaluation: { id: string; analysisId: string; chartsGzip: Buffer | null; chartsJson: string | null } | null;
} | null> {
  const chosen = db
    .select({
      id: evaluations.id,
      analysisId: evaluations.analysisId,
      chartsGzip: evaluations.chartsGzip,
      // The text only where the gzipped form is missing: reading both would fetch the document twice.
      chartsJson: dsql<string | null>`case when ${evaluations.chartsGzip} is null then ${evaluations.charts}::text end`.as("charts_json"),
    })
    .from(evaluations)
    .where(
      and(
        eq(evaluations.captureId, captures.id),
        evaluationId ? eq(evaluations.id, evaluationId) : dsql`(${captures.approvedEvaluationId} is null or ${evaluations.id} = ${captures.approvedEvaluationId})`,
      ),
    )
    .orderBy(desc(evaluations.createdAt))
    .limit(1)
    .as("chosen");
  const [row] = await db
    .select({ approvedEvaluationId: captures.approvedEvaluationId, id: chosen.id, analysisId: chosen.analysisId, chartsGzip: chosen.chartsGzip, chartsJson: chosen.chartsJson })
    .from(captures)
    .leftJoinLateral(chosen, dsql`true`)
    .where(and(eq(captures.id, captureId), capturesVisibleTo(reader)));
  if (!row) return null;
  return {
    approvedEvaluationId: row.approvedEvaluationId,
    evaluation: row.id && row.analysisId ? { id: row.id, analysisId: row.analysisId, chartsGzip: row.chartsGzip, chartsJson: row.chartsJson } : null,
  };
}

/**
 * The stored sheet body of one evaluation of a capture `reader` may see, in one query: the channel part
 * named `channel` (the first, i.e. worst, one for any other name), its gzipped body, and the capture's
 * approved evaluation. `null`: the capture is not visible (or does not exist) or has no such evaluation;
 * `part: null`: no channel part (none stored yet, or no channel); `gzip: null`: no body stored for it yet.
 */
export async function getVisibleSheetBody({ captureId, evaluationId, channel, reader }: { captureId: string; evaluationId: string; channel: string; reader: Reader }): Promise<{
  approvedEvaluationId: string | null;
  part: number | null;
  gzip: Buffer | null;
} | null> {
  const shown = db
    .select({ part: evaluationSheetParts.part })
    .from(evaluationSheetParts)
    .where(and(eq(evaluationSheetParts.evaluationId, evaluations.id), dsql`${evaluationSheetParts.part} > 0`))
    .orderBy(dsql`(${evaluationSheetParts.channel} = ${channel}) desc`, evaluationSheetParts.part)
    .limit(1)
    .as("shown");
  const [row] = await db
    .select({ approvedEvaluationId: captures.approvedEvaluationId, part: shown.part, gzip: evaluationSheetBodies.gzip })
    .from(captures)
    .innerJoin(evaluations, and(eq(evaluations.captureId, captures.id), eq(evaluations.id, evaluationId)))
    .leftJoinLateral(shown, dsql`true`)
    .leftJoin(evaluationSheetBodies, and(eq(evaluationSheetBodies.evaluationId, evaluations.id), eq(evaluationSheetBodies.part, shown.part)))
    .where(and(eq(captures.id, captureId), capturesVisibleTo(reader)));
  return row ?? null;
}

/** What `GET /api/captures/:id` answers: the capture's identity, state and progress, not its set-up or storage. */
export async function getCaptureStatus({ id, reader }: { id: string; reader: Reader }): Promise<CaptureView> {
  const [row] = await db
    .select(captureViewColumns)
    .from(captures)
    .where(and(eq(captures.id, id), capturesVisibleTo(reader)));
  if (!row) throw new AppError("not_found", "No such capture.");
  return row;
}

/** Other analysed captures of a site that `reader` may see, newest first (the sheet's "compare with" list). */
export async function listSiteSiblings({ siteId, exceptId, reader, limit = 20 }: { siteId: string; exceptId: string; reader: Reader; limit?: number }) {
  return db
    .select({ id: captures.id, title: captures.title, createdAt: captures.createdAt })
    .from(captures)
    .where(and(eq(captures.siteId, siteId), eq(captures.status, "done"), dsql`${captures.id} <> ${exceptId}`, capturesVisibleTo(reader)))
    .orderBy(desc(captures.createdAt))
    .limit(limit);
}
