"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { mutate } from "swr";
import { fieldErrorsOf } from "@/lib/errors";
import { FetchError, sendJson } from "@/lib/swr/fetcher";
import { limitSetsKey } from "@/lib/swr/use-limit-sets";
import { cloneLimitSetSchema } from "@/lib/validations/limit-set";

// Copies the current revision into a new custom set, e.g. a utility's own limits.
export function CloneForm({ sourceKey, sourceName }: { sourceKey: string; sourceName: string }) {
  const router = useRouter();
  const [values, setValues] = useState({ key: `${sourceKey}-custom`, name: `${sourceName} (custom)` });
  const [errors, setErrors] = useState<Record<string, string[]>>({});
  const [formError, setFormError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  async function submit(e: React.FormEvent) {
    e.preventDefault();
    setFormError(null);
    const parsed = cloneLimitSetSchema.safeParse(values);
    if (!parsed.success) return setErrors(fieldErrorsOf(parsed.error));
    setErrors({});
    setBusy(true);
    try {
      await sendJson(`/api/limit-sets/${sourceKey}/clone`, "POST", parsed.data);
      await mutate(limitSetsKey);
      router.push(`/limits/${parsed.data.key}`);
    } catch (err) {
      if (err instanceof FetchError && err.fieldErrors) setErrors(err.fieldErrors);
      setFormError(err instanceof Error ? err.message : "Could not clone the set.");
    } finally {
      setBusy(false);
    }
  }

  return (
    <form onSubmit={submit} className="panel space-y-3" noValidate data-testid="clone-form">
      <h2>Clone into a custom set</h2>
      <div className="grid gap-3 sm:grid-cols-2">
        <div>
          <label htmlFor="clone-key" className="field-label">New key</label>
          <input id="clone-key" className="field-input font-mono" value={values.key} onChange={(e) => setValues((v) => ({ ...v, key: e.target.value }))} aria-invalid={!!errors.key} />
          {errors.key?.map((m) => <p key={m} className="field-error">{m}</p>)}
        </div>
        <div>
          <label htmlFor="clone-name" className="field-label">Name</label>
          <input id="clone-name" className="field-input" value={values.name} onChange={(e) => setValues((v) => ({ ...v, name: e.target.value }))} aria-invalid={!!errors.name} />
          {errors.name?.map((m) => <p key={m} className="field-error">{m}</p>)}
        </div>
      </div>
      {formError && <p className="rounded bg-fail-light px-3 py-2 text-sm text-fail" role="alert">{formError}</p>}
      <button type="submit" className="btn-quiet" disabled={busy} data-testid="clone-submit">
        {busy ? "Cloning…" : "Clone"}
      </button>
    </form>
  );
}
