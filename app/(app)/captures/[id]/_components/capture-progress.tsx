"use client";

import Link from "next/link";
import { useRouter } from "next/navigation";
import { useEffect, useRef } from "react";
import { captureStatusSentences, failureReasonText } from "@/lib/reports/format";
import { useCapture, type CaptureStatusDto } from "@/lib/swr/use-capture";

/** Status of a capture that is not analysed yet; polls while queued/running and reloads the page when it settles. */
export function CaptureProgress({ initial, canFix }: { initial: CaptureStatusDto; canFix: boolean }) {
  const router = useRouter();
  const { data, error } = useCapture(initial.capture.id, { fallback: initial });
  const capture = data?.capture ?? initial.capture;
  const firstStatus = useRef(initial.capture.status);
  useEffect(() => {
    // The server renders the sheet or the failure once the run settles.
    if (capture.status !== firstStatus.current && (capture.status === "done" || capture.status === "failed")) router.refresh();
  }, [capture.status, router]);

  const percent = capture.status === "done" ? 100 : Math.max(0, Math.min(100, capture.progressPercent));
  const busy = capture.status === "queued" || capture.status === "running";
  return (
    <section className="panel space-y-3" data-testid="capture-progress" data-status={capture.status}>
      <p className="font-medium" data-testid="capture-status">{captureStatusSentences[capture.status] ?? capture.status}</p>
      {capture.status === "failed" ? (
        <div className="rounded-md border border-fail/40 bg-fail-light px-4 py-3 text-fail" role="alert" data-testid="failure-reason">
          <p className="font-semibold">Why it failed</p>
          <p className="mt-1 text-ink">{failureReasonText(capture.failureReason)}</p>
        </div>
      ) : (
        <div>
          <div
            className="h-3 w-full overflow-hidden rounded-full bg-paper-sunk"
            role="progressbar"
            aria-valuemin={0}
            aria-valuemax={100}
            aria-valuenow={percent}
            aria-label="Analysis progress"
          >
            <div className={`h-full rounded-full bg-copper transition-all ${busy ? "" : "opacity-40"}`} style={{ width: `${busy ? Math.max(percent, 3) : percent}%` }} />
          </div>
          <p className="mt-1 text-xs text-ink-muted">{busy ? `${percent} % — this page updates by itself.` : ""}</p>
        </div>
      )}
      {error && <p className="text-sm text-fail">Could not refresh the status: {error.message}</p>}
      {canFix && (capture.status === "failed" || capture.status === "uploaded") && (
        <Link href={`/captures/${capture.id}/setup`} className="btn-primary" data-testid="fix-mapping">
          {capture.status === "failed" ? "Fix the mapping" : "Map the channels"}
        </Link>
      )}
    </section>
  );
}
