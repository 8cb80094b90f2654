"use client";

import { useRouter } from "next/navigation";
import { useRequest } from "@/app/_components/use-request";
import { sendJson } from "@/lib/swr/fetcher";

const kindLabels = { waveform: "waveform record", "interval-log": "interval log" } as const;

/** Before analysis: switch the upload kind; before submission: the uploader withdraws the capture. */
export function CaptureActions({
  captureId,
  kind,
  canSwitchKind,
  canWithdraw,
}: {
  captureId: string;
  kind: "waveform" | "interval-log";
  canSwitchKind: boolean;
  canWithdraw: boolean;
}) {
  const router = useRouter();
  const { busy, error, run } = useRequest();
  const other = kind === "waveform" ? "interval-log" : "waveform";

  if (!canSwitchKind && !canWithdraw) return null;
  return (
    <section className="panel space-y-2 text-sm" data-testid="capture-actions">
      <p className="text-ink-soft">Uploaded as a {kindLabels[kind]}.</p>
      {error && <p className="field-error" role="alert">{error}</p>}
      <div className="flex flex-wrap gap-2">
        {canSwitchKind && (
          <button
            type="button"
            className="btn-quiet"
            disabled={busy}
            data-testid="switch-kind"
            onClick={() => run(async () => {
              await sendJson(`/api/captures/${captureId}`, "PATCH", { kind: other });
              router.push(`/captures/${captureId}/setup`);
            }, "That did not work.")}
          >
            It is an {kindLabels[other]}
          </button>
        )}
        {canWithdraw && (
          <button
            type="button"
            className="btn-quiet"
            disabled={busy}
            data-testid="withdraw"
            onClick={() => run(async () => {
              if (!window.confirm("Withdraw this capture? It disappears from the lists; the audit log keeps it.")) return;
              await sendJson(`/api/captures/${captureId}`, "DELETE");
              router.push("/captures");
            }, "That did not work.")}
          >
            Withdraw
          </button>
        )}
      </div>
    </section>
  );
}
