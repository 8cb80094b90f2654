"use client";

import type { EvaluationContext } from "@/lib/compliance/model";
import type { ChannelCompliance } from "@/lib/compliance/result";
import { FetchError } from "@/lib/swr/fetcher";
import { useCaptureDiagnosis, useMitigationStudies } from "@/lib/swr/use-mitigation-studies";
import { LikelySource } from "./likely-source";
import { SavedStudies } from "./saved-studies";
import { TryFix } from "./try-fix";

/**
 * Below the sheet of a signed-in user: which front end the selected current channel resembles
 * (likely-source.tsx), a "try a fix" form with the predicted spectrum and verdicts (try-fix.tsx,
 * prediction-view.tsx), and the capture's saved studies (saved-studies.tsx). Nothing shows on share
 * pages (their charts URL is not a capture's).
 */
export function MitigationPanels({ chartsUrl, channel, context }: { chartsUrl: string; channel: ChannelCompliance; context: EvaluationContext }) {
  // The sheet's charts URL carries the shown evaluation as a query (…/charts?evaluation=…); only its path names the capture.
  const [chartsPath, query] = chartsUrl.split("?") as [string, string | undefined];
  const base = chartsPath.startsWith("/api/captures/") && chartsPath.endsWith("/charts") ? chartsPath.slice(0, -"/charts".length) : null;
  // Every diagnosis and study here starts from the evaluation the sheet shows.
  const evaluationId = new URLSearchParams(query ?? "").get("evaluation");
  // Interval logs have no waveform to diagnose (409): the panels stay away.
  const { error } = useCaptureDiagnosis(base, evaluationId);
  const { data: studies } = useMitigationStudies(base);
  if (!base || (error instanceof FetchError && error.status === 409)) return null;
  return (
    <div className="space-y-4" data-testid="mitigation-panels">
      <LikelySource base={base} evaluationId={evaluationId} channelName={channel.channel} />
      {/* Viewers read the saved studies of the approved sheet but run no new what-ifs. */}
      {studies?.canTryFix && <TryFix base={base} evaluationId={evaluationId} approved={evaluationId !== null && evaluationId === studies.approvedEvaluationId} channel={channel} context={context} />}
      <SavedStudies base={base} evaluationId={evaluationId} />
    </div>
  );
}
