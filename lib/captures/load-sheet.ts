import "server-only";
import {
  getAnalysisById,
  getApproval,
  getCaptureById,
  getEvaluation,
  getUserContact,
  listEvaluations,
  listReviewEvents,
} from "@/db/queries/captures";
import { getSiteById } from "@/db/queries/sites";
import type { Role } from "@/lib/auth/permissions";
import { AppError } from "@/lib/errors";
import { decimateSeries } from "@/lib/reports/decimate-series";

/**
 * Everything the pass/fail sheet shows, in one plain object: the page, the PDF report,
 * the CSV export and the share page all render from this.
 * By default the approved evaluation while one exists, else the newest. Viewers and share links
 * (`approvedOnly`) see only the approved evaluation of an approved capture — never a newer, unreviewed one.
 */
export async function loadSheet({
  captureId,
  evaluationId,
  role,
  approvedOnly = role === "viewer",
}: {
  captureId: string;
  evaluationId?: string;
  role: Role;
  approvedOnly?: boolean;
}) {
  const capture = await getCaptureById({ id: captureId, role });
  if (approvedOnly && capture.approvedEvaluationId && evaluationId && evaluationId !== capture.approvedEvaluationId) {
    throw new AppError("not_found", "No such evaluation of this capture.");
  }
  const shownId = evaluationId ?? capture.approvedEvaluationId ?? undefined;
  const [site, allEvaluations, allReviews, uploader, evaluation, approval] = await Promise.all([
    getSiteById({ id: capture.siteId }),
    listEvaluations({ captureId }),
    listReviewEvents({ captureId }),
    getUserContact({ id: capture.uploadedBy }),
    getEvaluation({ captureId, evaluationId: shownId }),
    getApproval({ captureId, evaluationId: capture.approvedEvaluationId }),
  ]);
  if (evaluationId && !evaluation) throw new AppError("not_found", "No such evaluation of this capture.");
  const analysis = evaluation ? await getAnalysisById({ id: evaluation.analysisId }) : null;
  // Outside the team only the approved result and its history exist.
  const evaluations = approvedOnly && capture.approvedEvaluationId ? allEvaluations.filter((e) => e.id === capture.approvedEvaluationId) : allEvaluations;
  const reviews = approvedOnly && approval ? allReviews.filter((r) => r.createdAt <= approval.createdAt) : allReviews;
  const summary = evaluation ? allEvaluations.find((e) => e.id === evaluation.id) ?? null : null;
  const newest = allEvaluations[0] ?? null;
  return {
    capture,
    site,
    uploaderName: uploader?.name ?? null,
    analysis: analysis
      ? {
          id: analysis.id,
          createdAt: analysis.createdAt,
          result: analysis.result,
          setup: analysis.setup ?? null,
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
  };
}

export type Sheet = Awaited<ReturnType<typeof loadSheet>>;

/** The waveform, spectrum and trend data for the charts (loaded by the client through SWR). */
export async function loadChartData({ captureId, role, evaluationId }: { captureId: string; role: Role; evaluationId?: string }) {
  const capture = await getCaptureById({ id: captureId, role });
  // The charts follow the shown evaluation: the approved one by default, a named one for the team.
  const chosen = role === "viewer" ? undefined : evaluationId;
  const evaluation = await getEvaluation({ captureId, evaluationId: chosen ?? capture.approvedEvaluationId ?? undefined });
  const analysis = evaluation ? await getAnalysisById({ id: evaluation.analysisId }) : null;
  if (!analysis) throw new AppError("not_found", "The capture has not been analysed yet.");
  const r = analysis.result;
  const windowDurationS = r.window.cycles / r.fundamentalHz;
  // Per-order trends only for the orders the latest evaluation judged, so the payload stays small.
  const judged = new Map<string, number[]>();
  for (const c of evaluation?.result.channels ?? []) judged.set(c.channel, c.rows.filter((row) => row.limit !== null).map((row) => row.order));
  return {
    fundamentalHz: r.fundamentalHz,
    windowDurationS,
    waveform: analysis.waveform,
    intervalTrends: analysis.trends ?? null,
    channels: r.channels.map((c) => {
      const orders = judged.get(c.name) ?? [];
      return {
        name: c.name,
        quantity: c.quantity,
        unit: c.unit,
        harmonics: c.harmonics.map((h) => ({ order: h.order, rms: h.rms, percentOfFundamental: h.percentOfFundamental })),
        series: c.series ?? null,
        harmonicSeries: c.harmonicSeries && orders.length > 0 ? decimateSeries(c.harmonicSeries, orders, windowDurationS) : null,
      };
    }),
  };
}

export type ChartData = Awaited<ReturnType<typeof loadChartData>>;
