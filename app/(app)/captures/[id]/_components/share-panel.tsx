"use client";

import { useState } from "react";
import { mutate } from "swr";
import { SubmitButton } from "@/app/_components/submit-button";
import { useRequest } from "@/app/_components/use-request";
import { formatWhen } from "@/lib/reports/format";
import { sendJson } from "@/lib/swr/fetcher";
import { captureSharesKey, useCaptureShares } from "@/lib/swr/use-capture-shares";

/** Create read-only links for people outside the team, see them with their expiry, revoke them. */
export function SharePanel({ captureId }: { captureId: string }) {
  const { data, error: listError } = useCaptureShares(captureId);
  const [label, setLabel] = useState("");
  const [days, setDays] = useState("14");
  const [created, setCreated] = useState<string | null>(null);
  const [copied, setCopied] = useState(false);
  const { busy, error, setError, run } = useRequest();

  async function create(e: React.FormEvent) {
    e.preventDefault();
    setCopied(false);
    await run(async () => {
      const res = await sendJson<{ url: string }>(`/api/captures/${captureId}/shares`, "POST", { label, expiresInDays: Number(days) });
      setCreated(res.url);
      setLabel("");
      await mutate(captureSharesKey(captureId));
    }, "The link was not created.");
  }

  async function revoke(id: string) {
    await run(async () => {
      await sendJson(`/api/captures/${captureId}/shares/${id}`, "DELETE");
      await mutate(captureSharesKey(captureId));
    }, "The link was not revoked.");
  }

  async function copy() {
    if (!created) return;
    try {
      await navigator.clipboard.writeText(created);
      setCopied(true);
    } catch {
      setCopied(false);
      setError("Copying is blocked here; select the link and copy it by hand.");
    }
  }

  const now = Date.now();
  return (
    <section className="panel space-y-3" data-testid="share-panel">
      <h2>Share</h2>
      <form onSubmit={create} className="grid grid-cols-[1fr_5.5rem] gap-2">
        <div>
          <label htmlFor="share-label" className="field-label">Who it is for</label>
          <input id="share-label" value={label} onChange={(e) => setLabel(e.target.value)} maxLength={120} className="field-input" placeholder="e.g. utility reviewer" data-testid="share-label" />
        </div>
        <div>
          <label htmlFor="share-days" className="field-label">Days</label>
          <input id="share-days" value={days} onChange={(e) => setDays(e.target.value)} inputMode="numeric" className="field-input" data-testid="share-days" />
        </div>
        <SubmitButton busy={busy} busyLabel="Creating…" className="btn-quiet col-span-2" testId="share-create">
          Create read-only link
        </SubmitButton>
      </form>
      {created && (
        <div className="space-y-2 rounded-md border border-copper/40 bg-copper-light/60 p-3 text-sm" data-testid="share-created">
          <p className="font-medium">Copy the link now — it is shown only once.</p>
          <input readOnly value={created} onFocus={(e) => e.currentTarget.select()} className="field-input font-mono text-xs" data-testid="share-url" aria-label="Share link" />
          <button type="button" className="btn-primary" onClick={copy} data-testid="share-copy">
            {copied ? "Copied" : "Copy link"}
          </button>
        </div>
      )}
      {error && <p className="field-error" role="alert">{error}</p>}
      {listError && <p className="field-error">Links could not be loaded: {listError.message}</p>}
      {data && data.shares.length > 0 && (
        <ul className="divide-y divide-line text-sm" data-testid="share-list">
          {data.shares.map((s) => {
            const expired = new Date(s.expiresAt).getTime() < now;
            const state = s.revokedAt ? `revoked ${formatWhen(s.revokedAt)}` : expired ? `expired ${formatWhen(s.expiresAt)}` : `expires ${formatWhen(s.expiresAt)}`;
            return (
              <li key={s.id} className="flex items-center justify-between gap-2 py-2" data-testid="share-item" data-revoked={s.revokedAt ? "true" : undefined}>
                <div className="min-w-0">
                  <p className="truncate font-medium">{s.label || "Unlabelled link"}</p>
                  <p className="text-xs text-ink-muted">{state}</p>
                </div>
                {!s.revokedAt && !expired && (
                  <button type="button" className="btn-quiet px-2 py-1 text-xs" onClick={() => revoke(s.id)} data-testid="share-revoke">
                    Revoke
                  </button>
                )}
              </li>
            );
          })}
        </ul>
      )}
    </section>
  );
}
