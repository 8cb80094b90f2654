import "server-only";
import {
  getCaptureById,
  getEvaluation,
  getUserContact,
  latestAnalysis,
  latestAnalysisSummary,
  listEvaluations,
  listReviewEvents,
} from "@/db/queries/captures";
import { getRevisionVerification } from "@/db/queries/limit-verifications";
import { getSiteById } from "@/db/queries/sites";
import { canSeeReviewComments, type Reader } from "@/lib/auth/permissions";
import { AppError } from "@/lib/errors";
import { decimateSeries } from "@/lib/reports/decimate-series";

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

/** The waveform, spectrum and trend data for the charts (loaded by the client through SWR). */
export async function loadChartData({ captureId, reader }: { captureId: string; reader: Reader }) {
  await getCaptureById({ id: captureId, reader });
  const [analysis, evaluation] = await Promise.all([latestAnalysis({ captureId }), getEvaluation({ captureId })]);
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
