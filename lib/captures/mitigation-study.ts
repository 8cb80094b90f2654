import "server-only";
import { getCaptureById, getEvaluation, latestAnalysis } from "@/db/queries/captures";
import { getRevisionById } from "@/db/queries/studies";
import type { Reader } from "@/lib/auth/permissions";
import type { EvaluationContext } from "@/lib/compliance/model";
import { AppError } from "@/lib/errors";
import { diagnoseChannels, type Diagnosis } from "@/lib/frontends/diagnose-channels";
import { buildWhatIfReport } from "@/lib/mitigation/build-what-if-report";
import { MitigationInputError } from "@/lib/mitigation/mitigation-input-error";
import type { MitigationStudyInputs } from "@/lib/mitigation/study-inputs";
import type { WhatIfResult } from "@/lib/mitigation/types";

async function analysisOf(captureId: string, reader: Reader) {
  const capture = await getCaptureById({ id: captureId, reader });
  if (capture.kind === "interval-log") throw new AppError("conflict", "Front-end diagnosis needs a waveform record; this capture is an interval log.");
  const analysis = await latestAnalysis({ captureId });
  if (!analysis) throw new AppError("conflict", "The capture has not been analysed yet.");
  return analysis;
}

/** Which front end each current channel of the capture's latest analysis resembles. */
export async function diagnoseCapture({ captureId, reader }: { captureId: string; reader: Reader }): Promise<Diagnosis> {
  const analysis = await analysisOf(captureId, reader);
  return diagnoseChannels(analysis.result);
}

/**
 * A what-if prediction for the capture's latest analysis, judged against the limit-set revision
 * and context of its latest evaluation (the measured sheet's).
 */
export async function computeMitigationStudy({ captureId, reader, inputs }: { captureId: string; reader: Reader; inputs: MitigationStudyInputs }): Promise<{
  analysisId: string;
  evaluationId: string | null;
  result: WhatIfResult;
}> {
  const analysis = await analysisOf(captureId, reader);
  const evaluation = await getEvaluation({ captureId });
  const compliance = evaluation
    ? await getRevisionById({ id: evaluation.limitSetRevisionId }).then((revision) => ({
        limitSet: { key: revision.key, name: revision.name, revision: { id: revision.revisionId, number: revision.revisionNumber }, content: revision.content },
        context: evaluation.context as EvaluationContext,
      }))
    : undefined;
  try {
    const result = buildWhatIfReport({ analysis: analysis.result, mitigations: inputs.mitigations, network: inputs.network, compliance, channel: inputs.channel });
    return { analysisId: analysis.id, evaluationId: evaluation?.id ?? null, result };
  } catch (error) {
    if (error instanceof MitigationInputError) throw new AppError("validation", error.message);
    throw error;
  }
}
