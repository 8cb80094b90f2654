"use client";

import { useState } from "react";
import { SubmitButton } from "@/app/_components/submit-button";
import { useRequest } from "@/app/_components/use-request";
import type { EvaluationContext } from "@/lib/compliance/model";
import type { ChannelCompliance } from "@/lib/compliance/result";
import type { MitigationStudyInputs } from "@/lib/mitigation/study-inputs";
import type { Mitigation, WhatIfResult } from "@/lib/mitigation/types";
import { sendJson } from "@/lib/swr/fetcher";
import { PredictionView } from "./prediction-view";
import { SaveStudy } from "./saved-studies";

/** The form's fields as typed (strings until sent). */
interface FixForm {
  reactor: boolean;
  reactorPercent: string;
  choke: boolean;
  chokePercent: string;
  pulses: boolean;
  pulseCount: "12" | "18";
  imbalancePercent: string;
  filter: boolean;
  tuningOrder: string;
  kvar: string;
  q: string;
  xOverR: string;
  active: boolean;
  ratingA: string;
}

const initialForm: FixForm = {
  reactor: false,
  reactorPercent: "5",
  choke: false,
  chokePercent: "4",
  pulses: false,
  pulseCount: "12",
  imbalancePercent: "2",
  filter: false,
  tuningOrder: "4.7",
  kvar: "300",
  q: "30",
  xOverR: "",
  active: false,
  ratingA: "100",
};

function inputsOf(f: FixForm): MitigationStudyInputs {
  const mitigations: Mitigation[] = [];
  if (f.reactor) mitigations.push({ kind: "reactor", percent: Number(f.reactorPercent) });
  if (f.choke) mitigations.push({ kind: "dc-choke", percent: Number(f.chokePercent) });
  if (f.pulses) mitigations.push({ kind: "multi-pulse", pulses: f.pulseCount === "18" ? 18 : 12, imbalancePercent: Number(f.imbalancePercent) });
  if (f.filter) mitigations.push({ kind: "passive-filter", tuningOrder: Number(f.tuningOrder), kvar: Number(f.kvar), q: Number(f.q) });
  if (f.active) mitigations.push({ kind: "active-filter", ratingA: Number(f.ratingA), fromOrder: 2, toOrder: 50 });
  return { mitigations, ...(f.filter && f.xOverR.trim() !== "" ? { network: { xOverR: Number(f.xOverR) } } : {}) };
}

/** "Try a fix": pick mitigations, see the predicted spectrum and verdicts, save the prediction as a study. */
export function TryFix({ base, evaluationId, approved, channel, context }: { base: string; evaluationId: string | null; approved: boolean; channel: ChannelCompliance; context: EvaluationContext }) {
  const [form, setForm] = useState<FixForm>(initialForm);
  const [prediction, setPrediction] = useState<{ inputs: MitigationStudyInputs; result: WhatIfResult } | null>(null);
  const { busy, error, run } = useRequest();
  const set = <K extends keyof FixForm>(key: K, value: FixForm[K]) => setForm((f) => ({ ...f, [key]: value }));

  async function predict(e: React.FormEvent) {
    e.preventDefault();
    const predicted = await run(async () => {
      const inputs = inputsOf(form);
      const { result } = await sendJson<{ result: WhatIfResult }>(`${base}/studies/preview`, "POST", { ...inputs, ...(evaluationId ? { evaluationId } : {}) });
      setPrediction({ inputs, result });
    }, "The prediction failed.");
    if (!predicted) setPrediction(null);
  }

  const check = (key: "reactor" | "choke" | "pulses" | "filter" | "active", label: string) => (
    <label className="flex items-center gap-2 font-medium">
      <input type="checkbox" checked={form[key]} onChange={(e) => set(key, e.target.checked)} className="h-4 w-4 accent-copper" data-testid={`fix-${key}`} />
      {label}
    </label>
  );
  const num = (key: keyof FixForm, label: string, width = "w-20") => (
    <label className="flex items-center gap-1 text-ink-soft">
      {label}
      <input value={String(form[key])} onChange={(e) => set(key, e.target.value as never)} inputMode="decimal" className={`field-input ${width} py-1`} data-testid={`fix-${key}`} />
    </label>
  );

  return (
    <section className="panel text-sm" data-testid="try-fix" aria-labelledby="try-fix-heading">
      <h2 id="try-fix-heading" className="mb-1">Try a fix</h2>
      <p className="mb-3 text-ink-muted">Pick mitigations; Ordwise predicts the current into the supply and judges it against the same limit set revision and context as this sheet.</p>
      <p className="mb-3 text-ink-soft" data-testid="fix-starting-point">
        Starts from the evaluation this sheet shows{approved ? " — the approved one" : " — not approved; viewers and share links will not see studies of it"}. To start from another, open it from Evaluations.
      </p>
      <form onSubmit={predict} className="space-y-2">
        <div className="flex flex-wrap items-center gap-3">{check("reactor", "AC line reactor")}{num("reactorPercent", "%")}</div>
        <div className="flex flex-wrap items-center gap-3">{check("choke", "DC choke")}{num("chokePercent", "%")}</div>
        <div className="flex flex-wrap items-center gap-3">
          {check("pulses", "Multi-pulse")}
          <select value={form.pulseCount} onChange={(e) => set("pulseCount", e.target.value === "18" ? "18" : "12")} className="field-input w-24 py-1">
            <option value="12">12-pulse</option>
            <option value="18">18-pulse</option>
          </select>
          {num("imbalancePercent", "imbalance %")}
        </div>
        <div className="flex flex-wrap items-center gap-3">
          {check("filter", "Tuned filter at the PCC")}
          {num("tuningOrder", "order")}
          {num("kvar", "kvar", "w-24")}
          {num("q", "q")}
          {num("xOverR", "source X/R (default 10)")}
        </div>
        <div className="flex flex-wrap items-center gap-3">{check("active", "Active filter")}{num("ratingA", "A")}</div>
        <SubmitButton busy={busy} busyLabel="Predicting…" testId="fix-predict">
          Predict
        </SubmitButton>
      </form>
      {error && (
        <p className="mt-2 text-fail" role="alert" data-testid="fix-error">
          {error}
        </p>
      )}
      {prediction && <PredictionView result={prediction.result} channel={channel} context={context} />}
      {prediction && <SaveStudy base={base} evaluationId={evaluationId} inputs={prediction.inputs} />}
    </section>
  );
}
