import "server-only";
import {
  getApproval,
  getCaptureById,
  getEvaluation,
  getEvaluationCharts,
  getUserContact,
  getAnalysisById,
  getAnalysisSummary,
  latestAnalysis,
  listEvaluations,
  listReviewEvents,
  saveEvaluationCharts,
} from "@/db/queries/captures";
import { getRevisionVerification } from "@/db/queries/limit-verifications";
import { getSiteById } from "@/db/queries/sites";
import { canSeeReviewComments, type Reader } from "@/lib/auth/permissions";
import { AppError } from "@/lib/errors";
import { buildChartData } from "@/lib/reports/chart-data";

/**
 * Everything the pass/fail sheet shows, in one plain object: the page, the PDF report,
 * the CSV export and the share page all render from this.
 * By default the approved evaluation while one exists, else the newest. Viewers and share links
 * (`approvedOnly`) see only the approved evaluation of an approved capture — never a newer, unreviewed one.
 * `reader` limits what is visible (viewers: approved sheets of their customers' sites, no internal review comments).
 */
export async function loadSheet({
  captureId,
  evaluationId,
  reader,
  approvedOnly = reader.role === "viewer",
}: {
  captureId: string;
  evaluationId?: string;
  reader: Reader;
  approvedOnly?: boolean;
}) {
  const capture = await getCaptureById({ id: captureId, reader });
  if (approvedOnly && capture.approvedEvaluationId && evaluationId && evaluationId !== capture.approvedEvaluationId) {
    throw new AppError("not_found", "No such evaluation of this capture.");
  }
  const shownId = evaluationId ?? capture.approvedEvaluationId ?? undefined;
  const [site, allEvaluations, allReviews, uploader, evaluation, approval] = await Promise.all([
    getSiteById({ id: capture.siteId, reader }),
    listEvaluations({ captureId }),
    canSeeReviewComments(reader) ? listReviewEvents({ captureId }) : Promise.resolve([]),
    getUserContact({ id: capture.uploadedBy }),
    getEvaluation({ captureId, evaluationId: shownId }),
    getApproval({ captureId, evaluationId: capture.approvedEvaluationId }),
  ]);
  if (evaluationId && !evaluation) throw new AppError("not_found", "No such evaluation of this capture.");
  const analysis = evaluation ? await getAnalysisSummary({ id: evaluation.analysisId }) : null;
  // Outside the team only the approved result and its history exist.
  const evaluations = approvedOnly && capture.approvedEvaluationId ? allEvaluations.filter((e) => e.id === capture.approvedEvaluationId) : allEvaluations;
  const reviews = approvedOnly && approval ? allReviews.filter((r) => r.createdAt <= approval.createdAt) : allReviews;
  const summary = evaluation ? allEvaluations.find((e) => e.id === evaluation.id) ?? null : null;
  const newest = allEvaluations[0] ?? null;
  // Whether the revision this evaluation was judged against has been checked against the printed standard.
  const limitsVerification = summary ? await getRevisionVerification({ revisionId: summary.revisionId }) : null;
  return {
    capture,
    site,
    uploaderName: uploader?.name ?? null,
    analysis: analysis
      ? {
          id: analysis.id,
          createdAt: analysis.createdAt,
          result: analysis.result,
          setup: analysis.setup,
          fileSha256: analysis.fileSha256 ?? capture.sha256 ?? null,
        }
      : null,
    evaluation: evaluation && summary ? { ...summary, result: evaluation.result } : null,
    /** The approval of the shown evaluation, when it is the approved one. */
    approval: approval && evaluation && approval.evaluationId === evaluation.id ? approval : null,
    /** The newest evaluation when it is newer than the approved one the team is looking at. */
    newerResult: !approvedOnly && capture.approvedEvaluationId && newest && newest.id !== capture.approvedEvaluationId ? { id: newest.id, createdAt: newest.createdAt } : null,
    evaluations,
    reviews,
    limitsVerification,
  };
}

export type Sheet = Awaited<ReturnType<typeof loadSheet>>;

/**
 * The waveform, spectrum and trend data for the charts (loaded by the client through SWR): the data
 * precomputed when the evaluation was stored, read in two queries. The charts follow the shown
 * evaluation: a named one for the team, else the approved one while one exists, else the newest;
 * viewers always get the approved one. Evaluations stored before precomputation get theirs built once here and saved.
 */
export async function loadChartData({ captureId, reader, evaluationId }: { captureId: string; reader: Reader; evaluationId?: string }) {
  const capture = await getCaptureById({ id: captureId, reader });
  const named = reader.role === "viewer" && capture.approvedEvaluationId ? undefined : evaluationId;
  if (reader.role === "viewer" && evaluationId && evaluationId !== capture.approvedEvaluationId) throw new AppError("not_found", "No such evaluation of this capture.");
  const stored = await getEvaluationCharts({ captureId, evaluationId: named ?? capture.approvedEvaluationId ?? undefined });
  if (evaluationId && !stored) throw new AppError("not_found", "No such evaluation of this capture.");
  if (stored?.charts) return { evaluationId: stored.id, ...stored.charts };
  const [analysis, evaluation] = await Promise.all([
    stored ? getAnalysisById({ id: stored.analysisId }) : latestAnalysis({ captureId }),
    stored ? getEvaluation({ captureId, evaluationId: stored.id }) : null,
  ]);
  if (!analysis) throw new AppError("not_found", "The capture has not been analysed yet.");
  const charts = buildChartData({ analysis: analysis.result, waveform: analysis.waveform ?? null, trends: analysis.trends ?? null, evaluation: evaluation?.result ?? null });
  if (stored && stored.analysisId === analysis.id) await saveEvaluationCharts({ evaluationId: stored.id, charts });
  return { evaluationId: stored?.id ?? null, ...charts };
}

export type ChartData = Awaited<ReturnType<typeof loadChartData>>;
