"use client";

import { useRouter } from "next/navigation";
import { SubmitButton } from "@/app/_components/submit-button";
import { useRequest } from "@/app/_components/use-request";
import type { EvaluationContext } from "@/lib/compliance/model";
import { sendJson } from "@/lib/swr/fetcher";
import { reevaluateSchema } from "@/lib/validations/capture";
import { contextNumberFields } from "@/lib/validations/context-fields";
import { PhaseConfigSelect } from "./phase-config-select";

const numberFields = contextNumberFields;

/**
 * Re-judge the latest analysis in another context or against another limit set. Creates a new
 * evaluation (the old one stays in the history) and opens it.
 */
export function ContextForm({
  captureId,
  limitSets,
  initialKey,
  initialContext,
  conditions,
}: {
  captureId: string;
  limitSets: { key: string; name: string }[];
  initialKey: string;
  initialContext: EvaluationContext;
  conditions: { id: string; text: string }[];
}) {
  const router = useRouter();
  const { busy, error, setError, fieldErrors, setFieldErrors, run } = useRequest();

  async function onSubmit(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const form = new FormData(e.currentTarget);
    const context: Record<string, unknown> = {};
    for (const f of numberFields) {
      const raw = String(form.get(f.key) ?? "").trim().replace(",", ".");
      if (raw !== "") context[f.key] = Number(raw);
    }
    const phase = String(form.get("phaseConfig") ?? "");
    if (phase) context.phaseConfig = phase;
    if (form.get("isGenerator") === "on") context.isGenerator = true;
    const asserted = form.getAll("assertedConditions").map(String);
    if (asserted.length > 0) context.assertedConditions = asserted;
    if (initialContext.interpolate === false) context.interpolate = false;
    const parsed = reevaluateSchema.safeParse({ limitSetKey: form.get("limitSetKey"), context });
    if (!parsed.success) {
      const errs: Record<string, string[]> = {};
      for (const issue of parsed.error.issues) (errs[issue.path.join(".")] ??= []).push(issue.code === "invalid_type" && issue.expected === "number" ? "Enter a number" : issue.message);
      setFieldErrors(errs);
      setError("Some values need attention.");
      return;
    }
    await run(async () => {
      const res = await sendJson<{ evaluationId: string }>(`/api/captures/${captureId}/evaluations`, "POST", parsed.data);
      router.push(`/captures/${captureId}?evaluation=${res.evaluationId}`);
      router.refresh();
    }, "The evaluation failed.");
  }

  return (
    <form onSubmit={onSubmit} className="space-y-3" data-testid="context-form" noValidate>
      <div>
        <label htmlFor="ctx-limitSetKey" className="field-label">Limit set</label>
        <select id="ctx-limitSetKey" name="limitSetKey" defaultValue={initialKey} className="field-input">
          {limitSets.map((s) => (
            <option key={s.key} value={s.key}>{s.name}</option>
          ))}
        </select>
      </div>
      <div className="grid grid-cols-2 gap-3">
        {numberFields.map((f) => {
          const errs = fieldErrors[`context.${f.key}`];
          const value = initialContext[f.key];
          return (
            <div key={f.key}>
              <label htmlFor={`ctx-${f.key}`} className="field-label" title={f.hint}>
                {f.label}
                {f.unit ? ` (${f.unit})` : ""}
              </label>
              <input
                id={`ctx-${f.key}`}
                name={f.key}
                inputMode="decimal"
                defaultValue={typeof value === "number" ? String(value) : ""}
                className="field-input"
                aria-invalid={errs ? true : undefined}
                aria-describedby={errs ? `ctx-${f.key}-error` : undefined}
              />
              {errs && <p id={`ctx-${f.key}-error`} className="field-error">{errs[0]}</p>}
            </div>
          );
        })}
      </div>
      <div>
        <label htmlFor="ctx-phaseConfig" className="field-label">Phase configuration</label>
        <PhaseConfigSelect id="ctx-phaseConfig" name="phaseConfig" defaultValue={initialContext.phaseConfig ?? ""} />
      </div>
      <label className="flex items-center gap-2 text-sm">
        <input type="checkbox" name="isGenerator" defaultChecked={initialContext.isGenerator === true} className="h-4 w-4 accent-copper" />
        Power-generation equipment
      </label>
      {conditions.length > 0 && (
        <fieldset className="space-y-1">
          <legend className="field-label">Conditions that hold (cannot be checked from the capture)</legend>
          {conditions.map((c) => (
            <label key={c.id} className="flex items-start gap-2 text-sm">
              <input type="checkbox" name="assertedConditions" value={c.id} defaultChecked={initialContext.assertedConditions?.includes(c.id)} className="mt-0.5 h-4 w-4 accent-copper" />
              <span>{c.text}</span>
            </label>
          ))}
        </fieldset>
      )}
      {error && <p className="field-error" role="alert">{error}</p>}
      <SubmitButton busy={busy} busyLabel="Evaluating…" className="btn-primary w-full" testId="reevaluate">
        Evaluate again
      </SubmitButton>
      <p className="text-xs text-ink-muted">A new evaluation is added; earlier ones stay in the history.</p>
    </form>
  );
}
