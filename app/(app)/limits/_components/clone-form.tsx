"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { mutate } from "swr";
import { SubmitButton } from "@/app/_components/submit-button";
import { useRequest } from "@/app/_components/use-request";
import { fieldErrorsOf } from "@/lib/errors";
import { sendJson } from "@/lib/swr/fetcher";
import { limitSetsKey } from "@/lib/swr/use-limit-sets";
import { cloneLimitSetSchema } from "@/lib/validations/limit-set";

// Copies the current revision into a new custom set, e.g. a utility's own limits.
export function CloneForm({ sourceKey, sourceName }: { sourceKey: string; sourceName: string }) {
  const router = useRouter();
  const [values, setValues] = useState({ key: `${sourceKey}-custom`, name: `${sourceName} (custom)` });
  const { busy, error: formError, setError: setFormError, fieldErrors: errors, setFieldErrors: setErrors, run } = useRequest();

  async function submit(e: React.FormEvent) {
    e.preventDefault();
    setFormError(null);
    const parsed = cloneLimitSetSchema.safeParse(values);
    if (!parsed.success) return setErrors(fieldErrorsOf(parsed.error));
    await run(async () => {
      await sendJson(`/api/limit-sets/${sourceKey}/clone`, "POST", parsed.data);
      await mutate(limitSetsKey);
      router.push(`/limits/${parsed.data.key}`);
    }, "Could not clone the set.");
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
      <SubmitButton busy={busy} busyLabel="Cloning…" className="btn-quiet" testId="clone-submit">
        Clone
      </SubmitButton>
    </form>
  );
}
