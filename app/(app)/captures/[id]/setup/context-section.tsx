"use client";

import { useState } from "react";
import type { EvaluationContext } from "@/lib/compliance/model";
import { contextNumberFields } from "@/lib/validations/context-fields";
import { PhaseConfigSelect } from "../_components/phase-config-select";

const contextFields = contextNumberFields;

export const numberOrUndefined = (s: string) => (s.trim() === "" ? undefined : Number(s.replace(",", ".")));

/** State of the limit-set and context part of a setup form; `payload()` gives the values to validate. */
export function useContextState(initialLimitSetKey: string, initialContext: EvaluationContext) {
  const [limitSetKey, setLimitSetKey] = useState(initialLimitSetKey);
  const [values, setValues] = useState<Record<string, string>>(
    Object.fromEntries(contextFields.map((f) => [f.key, initialContext[f.key] != null ? String(initialContext[f.key]) : ""])),
  );
  const [phaseConfig, setPhaseConfig] = useState<string>(initialContext.phaseConfig ?? "");
  const [isGenerator, setIsGenerator] = useState(initialContext.isGenerator ?? false);
  const payload = () => ({
    limitSetKey,
    context: {
      ...Object.fromEntries(contextFields.map((f) => [f.key, numberOrUndefined(values[f.key] ?? "")])),
      ...(phaseConfig ? { phaseConfig } : {}),
      ...(isGenerator ? { isGenerator: true } : {}),
    },
  });
  return { limitSetKey, setLimitSetKey, values, setValues, phaseConfig, setPhaseConfig, isGenerator, setIsGenerator, payload };
}

export function ContextSection({
  state,
  limitSets,
  errors,
}: {
  state: ReturnType<typeof useContextState>;
  limitSets: { key: string; name: string }[];
  errors: Record<string, string[]>;
}) {
  const err = (k: string) => errors[k]?.map((m) => <p key={m} className="field-error">{m}</p>);
  return (
    <section className="panel space-y-3">
      <h2>Limit set and context</h2>
      <div>
        <label htmlFor="m-limits" className="field-label">Limit set</label>
        <select id="m-limits" className="field-input" value={state.limitSetKey} onChange={(e) => state.setLimitSetKey(e.target.value)}>
          {limitSets.map((l) => <option key={l.key} value={l.key}>{l.name} ({l.key})</option>)}
        </select>
        {err("limitSetKey")}
      </div>
      <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
        {contextFields.map((f) => (
          <div key={f.key}>
            <label htmlFor={`ctx-${f.key}`} className="field-label">
              {f.label}
              {f.unit ? ` (${f.unit})` : ""}
            </label>
            <input
              id={`ctx-${f.key}`}
              inputMode="decimal"
              className="field-input"
              value={state.values[f.key] ?? ""}
              onChange={(e) => state.setValues((c) => ({ ...c, [f.key]: e.target.value }))}
            />
            <p className="mt-0.5 text-2xs text-ink-muted">{f.hint}</p>
            {err(`context.${f.key}`)}
          </div>
        ))}
        <div>
          <label htmlFor="ctx-phase" className="field-label">Phase configuration</label>
          <PhaseConfigSelect id="ctx-phase" value={state.phaseConfig} onChange={(e) => state.setPhaseConfig(e.target.value)} />
        </div>
        <label className="flex items-center gap-2 self-end text-sm">
          <input type="checkbox" checked={state.isGenerator} onChange={(e) => state.setIsGenerator(e.target.checked)} />
          Power-generation equipment (IEEE 519 note c)
        </label>
      </div>
    </section>
  );
}
