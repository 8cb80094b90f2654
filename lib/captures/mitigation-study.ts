import "server-only";
import { getAnalysisById, getCaptureById, getEvaluation } from "@/db/queries/captures";
import { getRevisionById } from "@/db/queries/studies";
import { readsApprovedResultOnly, type Reader } from "@/lib/auth/permissions";
import type { EvaluationContext } from "@/lib/compliance/model";
import { AppError } from "@/lib/errors";
import { diagnoseChannels, type Diagnosis } from "@/lib/frontends/diagnose-channels";
import { buildWhatIfReport } from "@/lib/mitigation/build-what-if-report";
import { MitigationInputError } from "@/lib/mitigation/mitigation-input-error";
import type { MitigationStudyInputs } from "@/lib/mitigation/study-inputs";
import type { WhatIfResult } from "@/lib/mitigation/types";

/**
 * The evaluation a diagnosis or study starts from, with the analysis behind it: the one named (the team
 * may name any evaluation of the capture), else the approved one while there is one, else the newest.
 * Readers outside the team only ever get the approved evaluation; naming another is "not found".
 */
async function startingPoint(captureId: string, reader: Reader, evaluationId: string | undefined) {
  const capture = await getCaptureById({ id: captureId, reader });
  if (capture.kind === "interval-log") throw new AppError("conflict", "Front-end diagnosis needs a waveform record; this capture is an interval log.");
  if (readsApprovedResultOnly(reader) && evaluationId && evaluationId !== capture.approvedEvaluationId) throw new AppError("not_found", "No such evaluation of this capture.");
  const wanted = readsApprovedResultOnly(reader) ? (capture.approvedEvaluationId ?? undefined) : (evaluationId ?? capture.approvedEvaluationId ?? undefined);
  const evaluation = await getEvaluation({ captureId, evaluationId: wanted });
  if (!evaluation) {
    if (evaluationId) throw new AppError("not_found", "No such evaluation of this capture.");
    throw new AppError("conflict", "The capture has not been analysed yet.");
  }
  const analysis = await getAnalysisById({ id: evaluation.analysisId });
  if (!analysis) throw new AppError("conflict", "The capture has not been analysed yet.");
  return { evaluation, analysis };
}

/** Which front end each current channel resembles, in the analysis behind the evaluation the reader sees. */
export async function diagnoseCapture({ captureId, reader, evaluationId }: { captureId: string; reader: Reader; evaluationId?: string }): Promise<Diagnosis> {
  const { analysis } = await startingPoint(captureId, reader, evaluationId);
  return diagnoseChannels(analysis.result);
}

/**
 * A what-if prediction that starts from one evaluation of the capture: its analysis, judged against its
 * limit-set revision and context. The evaluation is the one named, else the sheet's default (approved,
 * else newest); the result names it (`evaluationId`) so a saved study says what it started from.
 */
export async function computeMitigationStudy({
  captureId,
  reader,
  inputs,
  evaluationId,
}: {
  captureId: string;
  reader: Reader;
  inputs: MitigationStudyInputs;
  evaluationId?: string;
}): Promise<{ analysisId: string; evaluationId: string; result: WhatIfResult }> {
  const { evaluation, analysis } = await startingPoint(captureId, reader, evaluationId);
  const revision = await getRevisionById({ id: evaluation.limitSetRevisionId });
  const compliance = {
    limitSet: { key: revision.key, name: revision.name, revision: { id: revision.revisionId, number: revision.revisionNumber }, content: revision.content },
    context: evaluation.context as EvaluationContext,
  };
  try {
    const result = buildWhatIfReport({ analysis: analysis.result, mitigations: inputs.mitigations, network: inputs.network, compliance, channel: inputs.channel });
    return { analysisId: analysis.id, evaluationId: evaluation.id, result };
  } catch (error) {
    if (error instanceof MitigationInputError) throw new AppError("validation", error.message);
    throw error;
  }
}
