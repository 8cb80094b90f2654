"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { SubmitButton } from "@/app/_components/submit-button";
import { useRequest } from "@/app/_components/use-request";
import { fieldErrorsOf } from "@/lib/errors";
import { sendJson } from "@/lib/swr/fetcher";
import { siteInputSchema } from "@/lib/validations/site";
import type { Site } from "@/db/schema";

type Values = Record<"name" | "address" | "nominalVoltageV" | "frequencyHz" | "iscA" | "ilA" | "notes", string>;

function initial(site?: Site): Values {
  return {
    name: site?.name ?? "",
    address: site?.address ?? "",
    nominalVoltageV: site ? String(site.nominalVoltageV) : "",
    frequencyHz: site ? String(site.frequencyHz) : "50",
    iscA: site?.iscA != null ? String(site.iscA) : "",
    ilA: site?.ilA != null ? String(site.ilA) : "",
    notes: site?.notes ?? "",
  };
}

export function SiteForm({ site }: { site?: Site }) {
  const router = useRouter();
  const [values, setValues] = useState<Values>(initial(site));
  const { busy, error: formError, setError: setFormError, fieldErrors: errors, setFieldErrors: setErrors, run } = useRequest();

  const set = (k: keyof Values) => (e: React.ChangeEvent<HTMLInputElement | HTMLTextAreaElement | HTMLSelectElement>) =>
    setValues((v) => ({ ...v, [k]: e.target.value }));

  async function submit(e: React.FormEvent) {
    e.preventDefault();
    setFormError(null);
    const parsed = siteInputSchema.safeParse(values);
    if (!parsed.success) {
      setErrors(fieldErrorsOf(parsed.error));
      return;
    }
    await run(async () => {
      const res = site
        ? await sendJson<{ site: Site }>(`/api/sites/${site.id}`, "PUT", parsed.data)
        : await sendJson<{ site: Site }>("/api/sites", "POST", parsed.data);
      router.push(`/sites/${res.site.id}`);
      router.refresh();
    }, "Could not save the site.");
  }

  const field = (k: keyof Values, label: string, props: React.InputHTMLAttributes<HTMLInputElement> = {}) => (
    <div>
      <label htmlFor={`site-${k}`} className="field-label">{label}</label>
      <input id={`site-${k}`} name={k} className="field-input" value={values[k]} onChange={set(k)} aria-invalid={!!errors[k]} {...props} />
      {errors[k]?.map((m) => <p key={m} className="field-error">{m}</p>)}
    </div>
  );

  return (
    <form onSubmit={submit} className="panel space-y-4" noValidate data-testid="site-form">
      {field("name", "Name")}
      {field("address", "Address")}
      <div className="grid gap-4 sm:grid-cols-2">
        {field("nominalVoltageV", "Nominal voltage (V, line-to-line for three-phase)", { inputMode: "decimal" })}
        <div>
          <label htmlFor="site-frequencyHz" className="field-label">Frequency</label>
          <select id="site-frequencyHz" name="frequencyHz" className="field-input" value={values.frequencyHz} onChange={set("frequencyHz")}>
            <option value="50">50 Hz</option>
            <option value="60">60 Hz</option>
          </select>
          {errors.frequencyHz?.map((m) => <p key={m} className="field-error">{m}</p>)}
        </div>
        {field("iscA", "Isc at the PCC (A, optional)", { inputMode: "decimal" })}
        {field("ilA", "IL, maximum demand load current (A, optional)", { inputMode: "decimal" })}
      </div>
      <div>
        <label htmlFor="site-notes" className="field-label">Notes</label>
        <textarea id="site-notes" name="notes" rows={3} className="field-input" value={values.notes} onChange={set("notes")} />
        {errors.notes?.map((m) => <p key={m} className="field-error">{m}</p>)}
      </div>
      {formError && <p className="rounded bg-fail-light px-3 py-2 text-sm text-fail" role="alert">{formError}</p>}
      <SubmitButton busy={busy} busyLabel="Saving…">
        {site ? "Save changes" : "Create site"}
      </SubmitButton>
    </form>
  );
}
