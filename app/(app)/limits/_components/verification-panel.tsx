"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { IsoDateInput } from "@/app/_components/iso-date-input";
import { FetchError, sendJson } from "@/lib/swr/fetcher";

export interface VerificationItem {
  edition: string;
  checked: string;
  verifiedByName: string;
  verifiedOn: string;
  note: string;
}

/**
 * A revision's verification state against the printed standard, its history, and (for an admin
 * who holds the edition) the form that records a new verification. The revision itself never changes.
 */
export function VerificationPanel({
  limitSetKey,
  revisionNumber,
  verifications,
  canVerify,
  today,
}: {
  limitSetKey: string;
  revisionNumber: number;
  verifications: VerificationItem[];
  canVerify: boolean;
  today: string;
}) {
  const router = useRouter();
  const [errors, setErrors] = useState<Record<string, string[]>>({});
  const [message, setMessage] = useState<string | null>(null);
  const latest = verifications[0];

  async function submit(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const fd = new FormData(e.currentTarget);
    try {
      await sendJson(`/api/limit-sets/${limitSetKey}/revisions/${revisionNumber}/verifications`, "POST", {
        edition: fd.get("edition"),
        checked: fd.get("checked"),
        verifiedOn: fd.get("verifiedOn"),
        note: fd.get("note"),
      });
      setErrors({});
      setMessage("Verification recorded.");
      router.refresh();
    } catch (err) {
      if (err instanceof FetchError && err.fieldErrors) setErrors(err.fieldErrors);
      setMessage(err instanceof Error ? err.message : "Could not record the verification.");
    }
  }

  return (
    <section className="panel space-y-3 text-sm" data-testid="verification-panel">
      <h2>Checked against the printed standard</h2>
      {latest ? (
        <p className="rounded bg-pass-light px-3 py-2 text-pass" data-testid="verification-state" data-verified="true">
          Verified: {latest.edition} {latest.checked}, by {latest.verifiedByName} on {latest.verifiedOn}
          {latest.note ? ` — ${latest.note}` : ""}
        </p>
      ) : (
        <p className="rounded bg-caution-light px-3 py-2 text-caution" data-testid="verification-state" data-verified="false">
          Not yet verified against the printed standard. Sheets judged with this revision say so.
        </p>
      )}
      {verifications.length > 1 && (
        <ul className="list-disc pl-5 text-ink-soft">
          {verifications.slice(1).map((v) => (
            <li key={`${v.verifiedOn}-${v.verifiedByName}-${v.checked}`}>
              {v.edition} {v.checked}, by {v.verifiedByName} on {v.verifiedOn}
            </li>
          ))}
        </ul>
      )}
      {canVerify && (
        <form onSubmit={submit} className="grid gap-3 sm:grid-cols-3" noValidate data-testid="verification-form">
          <div>
            <label htmlFor="verify-edition" className="field-label">Printed edition held</label>
            <input id="verify-edition" name="edition" className="field-input" placeholder="IEC 61000-3-2:2018" />
            {errors.edition?.map((m) => <p key={m} className="field-error">{m}</p>)}
          </div>
          <div>
            <label htmlFor="verify-checked" className="field-label">Clause or table checked</label>
            <input id="verify-checked" name="checked" className="field-input" placeholder="Table 1" />
            {errors.checked?.map((m) => <p key={m} className="field-error">{m}</p>)}
          </div>
          <IsoDateInput id="verify-date" name="verifiedOn" label="Date checked" defaultValue={today} error={errors.verifiedOn?.join(" ")} />
          <div className="sm:col-span-3">
            <label htmlFor="verify-note" className="field-label">Note (optional)</label>
            <input id="verify-note" name="note" className="field-input" />
          </div>
          <div className="sm:col-span-3">
            <button type="submit" className="btn-primary" data-testid="verification-submit">Record verification of revision {revisionNumber}</button>
          </div>
        </form>
      )}
      {message && <p role="status">{message}</p>}
    </section>
  );
}
