import "server-only";
import {
  getCaptureById,
  getEvaluation,
  getEvaluationCharts,
  getUserContact,
  latestAnalysis,
  latestAnalysisSummary,
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
 * `reader` limits what is visible (viewers: approved sheets of their customers' sites, no internal review comments).
 */
export async function loadSheet({ captureId, evaluationId, reader }: { captureId: string; evaluationId?: string; reader: Reader }) {
  const capture = await getCaptureById({ id: captureId, reader });
  const [site, analysis, evaluations, reviews, uploader] = await Promise.all([
    getSiteById({ id: capture.siteId, reader }),
    latestAnalysisSummary({ captureId }),
    listEvaluations({ captureId }),
    canSeeReviewComments(reader) ? listReviewEvents({ captureId }) : Promise.resolve([]),
    getUserContact({ id: capture.uploadedBy }),
  ]);
  const evaluation = await getEvaluation({ captureId, evaluationId });
  if (evaluationId && !evaluation) throw new AppError("not_found", "No such evaluation of this capture.");
  const summary = evaluation ? evaluations.find((e) => e.id === evaluation.id) ?? null : null;
  // Whether the revision this evaluation was judged against has been checked against the printed standard.
  const limitsVerification = summary ? await getRevisionVerification({ revisionId: summary.revisionId }) : null;
  return {
    capture,
    site,
    uploaderName: uploader?.name ?? null,
    analysis: analysis ? { id: analysis.id, createdAt: analysis.createdAt, result: analysis.result } : null,
    evaluation: evaluation && summary ? { ...summary, result: evaluation.result } : null,
    evaluations,
    reviews,
    limitsVerification,
  };
}

export type Sheet = Awaited<ReturnType<typeof loadSheet>>;

/**
 * The waveform, spectrum and trend data for the charts (loaded by the client through SWR): the data
 * precomputed when the evaluation was stored (`evaluationId`, or the newest), read in two queries.
 * Evaluations stored before precomputation get theirs built once here and saved.
 */
export async function loadChartData({ captureId, reader, evaluationId }: { captureId: string; reader: Reader; evaluationId?: string }) {
  await getCaptureById({ id: captureId, reader });
  const stored = await getEvaluationCharts({ captureId, evaluationId });
  if (evaluationId && !stored) throw new AppError("not_found", "No such evaluation of this capture.");
  if (stored?.charts) return { evaluationId: stored.id, ...stored.charts };
  const [analysis, evaluation] = await Promise.all([latestAnalysis({ captureId }), stored ? getEvaluation({ captureId, evaluationId: stored.id }) : null]);
  if (!analysis) throw new AppError("not_found", "The capture has not been analysed yet.");
  const charts = buildChartData({ analysis: analysis.result, waveform: analysis.waveform ?? null, trends: analysis.trends ?? null, evaluation: evaluation?.result ?? null });
  if (stored && stored.analysisId === analysis.id) await saveEvaluationCharts({ evaluationId: stored.id, charts });
  return { evaluationId: stored?.id ?? null, ...charts };
}

export type ChartData = Awaited<ReturnType<typeof loadChartData>>;
