import "server-only";
import {
  getApproval,
  getAnalysisById,
  getEvaluation,
  latestAnalysis,
  listEvaluations,
  listReviewEvents,
  saveEvaluationCharts,
} from "@/db/queries/captures";
import type { VerificationView } from "@/db/queries/limit-verifications";
import { getSheetCapture, getSheetEvaluation, getSheetView, getVisibleChartsJson, getVisibleSheetBody, insertSheetBody, sheetBodyGzip } from "@/db/queries/sheet";
import { canSeeReviewComments, readsApprovedResultOnly, type Reader } from "@/lib/auth/permissions";
import { AppError } from "@/lib/errors";
import { buildChartData } from "@/lib/reports/chart-data";
import { storedGzip } from "@/lib/reports/stored-gzip";

interface SheetArgs {
  captureId: string;
  evaluationId?: string;
  reader: Reader;
  approvedOnly?: boolean;
}

/** An evaluation as a sheet reads it: its analysis summary, its revision's verification, and `P` of it. */
type ReadEvaluation<P> = (args: { captureId: string; evaluationId?: string }) => Promise<
  ({ id: string; analysis: NonNullable<Awaited<ReturnType<typeof getSheetEvaluation>>>["analysis"]; verification: VerificationView | null } & P) | null
>;

/**
 * Everything the pass/fail sheet shows, in one plain object, with `read`'s part of the shown evaluation.
 * By default the approved evaluation while one exists, else the newest. Viewers and share links
 * (`approvedOnly`) see only the approved evaluation of an approved capture — never a newer, unreviewed one.
 * `reader` limits what is visible (viewers: approved sheets of their customers' sites, no internal review comments).
 */
async function loadSheetWith<P extends object>({ captureId, evaluationId, reader, approvedOnly = readsApprovedResultOnly(reader) }: SheetArgs, read: ReadEvaluation<P>) {
  // Two round trips: the capture (with its site and uploader) decides what may be read; then the rest at once.
  const { capture, site, uploaderName } = await getSheetCapture({ id: captureId, reader });
  if (approvedOnly && capture.approvedEvaluationId && evaluationId && evaluationId !== capture.approvedEvaluationId) {
    throw new AppError("not_found", "No such evaluation of this capture.");
  }
  const shownId = evaluationId ?? capture.approvedEvaluationId ?? undefined;
  const [allEvaluations, allReviews, loaded, approval] = await Promise.all([
    listEvaluations({ captureId }),
    canSeeReviewComments(reader) ? listReviewEvents({ captureId }) : Promise.resolve([]),
    // The shown evaluation with its analysis summary and its revision's verification, without chart data.
    read({ captureId, evaluationId: shownId }),
    getApproval({ captureId, evaluationId: capture.approvedEvaluationId }),
  ]);
  if (evaluationId && !loaded) throw new AppError("not_found", "No such evaluation of this capture.");
  // Outside the team only the approved result and its history exist.
  const evaluations = approvedOnly && capture.approvedEvaluationId ? allEvaluations.filter((e) => e.id === capture.approvedEvaluationId) : allEvaluations;
  const reviews = approvedOnly && approval ? allReviews.filter((r) => r.createdAt <= approval.createdAt) : allReviews;
  const summary = loaded ? allEvaluations.find((e) => e.id === loaded.id) ?? null : null;
  const newest = allEvaluations[0] ?? null;
  const { id: _id, analysis, verification, ...payload } = loaded ?? { id: null, analysis: null, verification: null };
  return {
    capture,
    site,
    uploaderName,
    analysis: analysis
      ? {
          id: analysis.id,
          createdAt: analysis.createdAt,
          result: analysis.result,
          setup: analysis.setup,
          fileSha256: analysis.fileSha256 ?? capture.sha256 ?? null,
        }
      : null,
    evaluation: loaded && summary ? { ...summary, ...(payload as P) } : null,
    /** The approval of the shown evaluation, when it is the approved one. */
    approval: approval && loaded && approval.evaluationId === loaded.id ? approval : null,
    /** The newest evaluation when it is newer than the approved one the team is looking at. */
    newerResult: !approvedOnly && capture.approvedEvaluationId && newest && newest.id !== capture.approvedEvaluationId ? { id: newest.id, createdAt: newest.createdAt } : null,
    evaluations,
    reviews,
    /** Whether the revision this evaluation was judged against has been checked against the printed standard. */
    limitsVerification: summary ? verification : null,
  };
}

/** The sheet with the shown evaluation's whole result: what the PDF report, the CSV export and the comparison render. */
export function loadSheet(args: SheetArgs) {
  return loadSheetWith(args, async (a) => getSheetEvaluation(a));
}

/**
 * The sheet as its page (and the share page) shows it: the shown evaluation's result without its rows
 * (`result`, lib/reports/result-head.ts) and one channel whole (`shownChannel`: the one named `channel`,
 * else the first, i.e. worst; none for `channel: null`, when the page's client loads it) — what the page
 * renders and sends, not the whole result.
 */
export function loadSheetPage({ channel, ...args }: SheetArgs & { channel?: string | null }) {
  return loadSheetWith(args, async (a) => {
    const view = await getSheetView({ ...a, channel });
    return view && { id: view.id, analysis: view.analysis, verification: view.verification, result: view.head, shownChannel: view.channel };
  });
}

export type Sheet = Awaited<ReturnType<typeof loadSheet>>;
export type SheetPage = Awaited<ReturnType<typeof loadSheetPage>>;

/**
 * The waveform, spectrum and trend data for the charts (loaded by the client through SWR) as the gzipped
 * JSON stored with the evaluation when it was stored — sent as it is, never parsed, serialised or
 * compressed again — read in one query with the capture's visibility. The charts follow the shown
 * evaluation: a named one for the team, else the approved one while one exists, else the newest; viewers
 * always get the approved one. Evaluations stored before precomputation get theirs built (or gzipped)
 * once here and saved. `tag` is the id of the evaluation the data belong to (the response's validator;
 * null only when a capture has an analysis but no evaluation yet).
 */
export async function loadChartJson({ captureId, reader, evaluationId }: { captureId: string; reader: Reader; evaluationId?: string }): Promise<{ tag: string | null; gzip: Buffer }> {
  const viewer = readsApprovedResultOnly(reader);
  const found = await getVisibleChartsJson({ captureId, reader, evaluationId: viewer ? undefined : evaluationId });
  if (!found) throw new AppError("not_found", "No such capture.");
  if (viewer && evaluationId && evaluationId !== found.approvedEvaluationId) throw new AppError("not_found", "No such evaluation of this capture.");
  const stored = found.evaluation;
  if (evaluationId && !stored) throw new AppError("not_found", "No such evaluation of this capture.");
  if (stored?.chartsGzip) return { tag: stored.id, gzip: stored.chartsGzip };
  if (stored?.chartsJson) return { tag: stored.id, gzip: await saveEvaluationCharts({ evaluationId: stored.id, charts: { text: stored.chartsJson } }) };
  const [analysis, evaluation] = await Promise.all([
    stored ? getAnalysisById({ id: stored.analysisId }) : latestAnalysis({ captureId }),
    stored ? getEvaluation({ captureId, evaluationId: stored.id }) : null,
  ]);
  if (!analysis) throw new AppError("not_found", "The capture has not been analysed yet.");
  const charts = buildChartData({ analysis: analysis.result, waveform: analysis.waveform ?? null, trends: analysis.trends ?? null, evaluation: evaluation?.result ?? null });
  if (stored && stored.analysisId === analysis.id) return { tag: stored.id, gzip: await saveEvaluationCharts({ evaluationId: stored.id, charts }) };
  return { tag: stored?.id ?? null, gzip: storedGzip(charts) };
}

/**
 * The sheet body of one evaluation (lib/reports/sheet-body-data.ts: the channel list and the channel named
 * `channel`, else the first, i.e. worst, one) as the signed-in sheet page's client loads it — `{ body }`
 * as JSON, gzipped as stored with the evaluation, sent as it is; `body` is null when the evaluation has no
 * channel. The same visibility as the sheet: the capture as `reader` may see it, and for viewers only its
 * approved evaluation. An evaluation's body never changes: `tag` names it (evaluation and channel part).
 * One stored before bodies were gets its body built once here and stored.
 */
export async function loadSheetBody({ captureId, evaluationId, channel, reader }: { captureId: string; evaluationId: string; channel?: string; reader: Reader }): Promise<{ tag: string; gzip: Buffer }> {
  const found = await getVisibleSheetBody({ captureId, evaluationId, channel: channel ?? "", reader });
  if (!found || (readsApprovedResultOnly(reader) && evaluationId !== found.approvedEvaluationId)) throw new AppError("not_found", "No such evaluation of this capture.");
  if (found.part !== null && found.gzip) return { tag: `${evaluationId}.${found.part}`, gzip: found.gzip };
  // Stored before its body (or its parts) were: getSheetView reads (or splits and stores) the parts.
  const view = await getSheetView({ captureId, evaluationId, channel });
  if (!view?.channel) return { tag: `${evaluationId}.0`, gzip: storedGzip({ body: null }) };
  const part = view.head.channels.findIndex((c) => c.channel === view.channel!.channel) + 1;
  const gzip = sheetBodyGzip(view.head, view.channel);
  if (part > 0) await insertSheetBody({ evaluationId, part, gzip });
  return { tag: `${evaluationId}.${part}`, gzip };
}
