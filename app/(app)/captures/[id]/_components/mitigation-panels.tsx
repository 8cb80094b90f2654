"use client";

import { useMemo, useState } from "react";
import { mutate } from "swr";
import { SpectrumChart } from "@/app/_components/charts/spectrum-chart";
import { VerdictBadge } from "@/app/_components/verdict-badge";
import type { EvaluationContext } from "@/lib/compliance/model";
import type { ChannelCompliance } from "@/lib/compliance/result";
import { FAMILY_LABELS, PARAMETER_LABELS } from "@/lib/frontends/family-labels";
import { describeMitigation } from "@/lib/mitigation/describe-mitigation";
import type { MitigationStudyInputs } from "@/lib/mitigation/study-inputs";
import type { Mitigation, WhatIfResult } from "@/lib/mitigation/types";
import { formatWhen } from "@/lib/reports/format";
import { unitScale } from "@/lib/reports/spectrum-bars";
import { tableLimitOf } from "@/lib/reports/time-rules";
import { FetchError, sendJson } from "@/lib/swr/fetcher";
import { captureStudiesKey, useCaptureDiagnosis, useMitigationStudies, type SavedStudyDto } from "@/lib/swr/use-mitigation-studies";

const fmt = (v: number | null | undefined, digits = 3): string => (v == null ? "—" : Number(v.toPrecision(digits)).toString());

/**
 * Below the sheet of a signed-in user: which front end the selected current channel resembles,
 * a "try a fix" form with the predicted spectrum and verdicts, and the capture's saved studies.
 * Nothing shows on share pages (their charts URL is not a capture's).
 */
export function MitigationPanels({ chartsUrl, channel, context }: { chartsUrl: string; channel: ChannelCompliance; context: EvaluationContext }) {
  // The sheet's charts URL carries the shown evaluation as a query (…/charts?evaluation=…); only its path names the capture.
  const [chartsPath, query] = chartsUrl.split("?") as [string, string | undefined];
  const base = chartsPath.startsWith("/api/captures/") && chartsPath.endsWith("/charts") ? chartsPath.slice(0, -"/charts".length) : null;
  // Every diagnosis and study here starts from the evaluation the sheet shows.
  const evaluationId = new URLSearchParams(query ?? "").get("evaluation");
  // Interval logs have no waveform to diagnose (409): the panels stay away.
  const { error } = useCaptureDiagnosis(base, evaluationId);
  const { data: studies } = useMitigationStudies(base);
  if (!base || (error instanceof FetchError && error.status === 409)) return null;
  return (
    <div className="space-y-4" data-testid="mitigation-panels">
      <LikelySource base={base} evaluationId={evaluationId} channelName={channel.channel} />
      {/* Viewers read the saved studies of the approved sheet but run no new what-ifs. */}
      {studies?.canTryFix && <TryFix base={base} evaluationId={evaluationId} approved={evaluationId !== null && evaluationId === studies.approvedEvaluationId} channel={channel} context={context} />}
      <SavedStudies base={base} evaluationId={evaluationId} />
    </div>
  );
}

function LikelySource({ base, evaluationId, channelName }: { base: string; evaluationId: string | null; channelName: string }) {
  const { data, error, isLoading } = useCaptureDiagnosis(base, evaluationId);
  const dx = data?.diagnosis.channels.find((c) => c.name === channelName);
  return (
    <section className="panel text-sm" data-testid="likely-source" aria-labelledby="likely-source-heading">
      <h2 id="likely-source-heading" className="mb-1">Likely source — {channelName}</h2>
      <p className="mb-2 text-ink-muted">A resemblance between the measured spectrum and published converter models, not a statement of what is installed.</p>
      {isLoading && <p className="text-ink-muted">Fitting models…</p>}
      {error && <p className="text-fail">{error.message}</p>}
      {data && !dx && <p className="text-ink-muted">This channel is not a current channel.</p>}
      {dx && (
        <>
          <p className="mb-2 font-medium" data-testid="likely-source-summary">{dx.summary}</p>
          <table className="w-full text-left">
            <thead className="text-ink-muted">
              <tr>
                <th className="py-1 pr-2">#</th>
                <th className="py-1 pr-2">Front end</th>
                <th className="py-1 pr-2">Fitted parameters</th>
                <th className="py-1 text-right">Fit error, % of I₁</th>
              </tr>
            </thead>
            <tbody>
              {dx.candidates.map((c, k) => (
                <tr key={c.family} className="border-t border-line" data-testid={`candidate-${k}`}>
                  <td className="py-1 pr-2">{k + 1}</td>
                  <td className="py-1 pr-2">{FAMILY_LABELS[c.family]}</td>
                  <td className="py-1 pr-2">
                    {Object.entries(c.parameters)
                      .map(([name, v]) => {
                        // "firing angle 10°", "commutation reactance 12.7 %": the value, then its unit.
                        const p = PARAMETER_LABELS[name] ?? { label: "fitted parameter", unit: "" };
                        return `${p.label} ${fmt(v)}${p.unit === "°" ? "°" : p.unit ? ` ${p.unit}` : ""}`;
                      })
                      .join(" · ") || "—"}
                  </td>
                  <td className="py-1 text-right tabular-nums">{c.fitErrorPercent.toFixed(1)}</td>
                </tr>
              ))}
            </tbody>
          </table>
          {!dx.usedVoltage && <p className="mt-2 text-ink-muted">No voltage channel is paired with this current, so the displacement angle was not used.</p>}
        </>
      )}
    </section>
  );
}

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

function TryFix({ base, evaluationId, approved, channel, context }: { base: string; evaluationId: string | null; approved: boolean; channel: ChannelCompliance; context: EvaluationContext }) {
  const [form, setForm] = useState<FixForm>(initialForm);
  const [prediction, setPrediction] = useState<{ inputs: MitigationStudyInputs; result: WhatIfResult } | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const set = <K extends keyof FixForm>(key: K, value: FixForm[K]) => setForm((f) => ({ ...f, [key]: value }));

  async function predict(e: React.FormEvent) {
    e.preventDefault();
    setBusy(true);
    setError(null);
    try {
      const inputs = inputsOf(form);
      const { result } = await sendJson<{ result: WhatIfResult }>(`${base}/studies/preview`, "POST", { ...inputs, ...(evaluationId ? { evaluationId } : {}) });
      setPrediction({ inputs, result });
    } catch (err) {
      setPrediction(null);
      setError(err instanceof Error ? err.message : "The prediction failed.");
    } finally {
      setBusy(false);
    }
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
        <button type="submit" className="btn-primary" disabled={busy} data-testid="fix-predict">
          {busy ? "Predicting…" : "Predict"}
        </button>
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

function PredictionView({ result, channel, context }: { result: WhatIfResult; channel: ChannelCompliance; context: EvaluationContext }) {
  const predictedChannel = result.channels.find((c) => c.name === channel.channel) ?? result.channels[0];
  const predictedRows = result.compliance?.channels.find((c) => c.channel === channel.channel)?.rows ?? [];
  const charts = useMemo(() => {
    if (!predictedChannel) return null;
    const i1 = predictedChannel.fundamentalA;
    const dto = (pick: "measuredRms" | "rms") => ({
      name: predictedChannel.name,
      quantity: "current" as const,
      unit: "A",
      harmonics: predictedChannel.harmonics.map((h) => ({ order: h.order, rms: h[pick], percentOfFundamental: h[pick] === null || !(i1 > 0) ? null : (100 * h[pick]!) / i1 })),
      series: null,
      harmonicSeries: null,
    });
    return { measured: dto("measuredRms"), predicted: dto("rms") };
  }, [predictedChannel]);
  if (!predictedChannel || !charts) return null;
  const measuredByOrder = new Map(channel.rows.map((r) => [r.order, r]));
  const predictedByOrder = new Map(predictedRows.map((r) => [r.order, r]));
  // One unit per column: the limit in amperes (converted with the base the evaluator used) and, where
  // the table states it in another unit (%IL, %Iref, %I1), that unit in its own column.
  const rowUnit = channel.rows.find((r) => r.limit !== null)?.unit ?? "A";
  const perRowUnitA = unitScale(rowUnit, {
    fundamentalRms: predictedChannel?.fundamentalA ?? 0,
    ilA: context.ilA,
    irefA: channel.derived.irefA ?? context.irefA,
    nominalVoltageV: context.nominalVoltageV,
  });
  const limitA = (limit: number | null | undefined) => (limit == null || perRowUnitA === null ? null : limit * perRowUnitA);
  const orders = predictedChannel.harmonics.filter((h) => h.order >= 2 && (measuredByOrder.get(h.order)?.limit != null || (h.measuredRms ?? 0) > 0.01 * predictedChannel.fundamentalA));
  return (
    <div className="mt-4 space-y-3" data-testid="prediction">
      <p className="rounded-md border border-caution/40 bg-caution-light px-3 py-2 font-semibold text-caution" data-testid="prediction-label">
        PREDICTION — {result.mitigations.map(describeMitigation).join(" + ")}
      </p>
      <div className="flex flex-wrap items-center gap-3">
        <span>Predicted verdict:</span>
        {result.compliance ? <VerdictBadge verdict={result.compliance.verdict} size="lg" testId="prediction-verdict" /> : <span className="text-ink-muted">not judged (no evaluation)</span>}
        <span className="text-ink-soft">
          THD {predictedChannel.measuredThdPercent.toFixed(1)} % → {predictedChannel.thdPercent.toFixed(1)} %
          {predictedChannel.tddPercent !== null && predictedChannel.measuredTddPercent !== null && ` · TDD ${predictedChannel.measuredTddPercent.toFixed(1)} % → ${predictedChannel.tddPercent.toFixed(1)} %`}
        </span>
      </div>
      <div className="grid gap-3 lg:grid-cols-2">
        <div>
          <h3 className="mb-1 text-ink-soft">Measured</h3>
          <SpectrumChart channel={charts.measured} rows={channel.rows} mode="amperes" />
        </div>
        <div>
          <h3 className="mb-1 text-ink-soft">Predicted</h3>
          <SpectrumChart channel={charts.predicted} rows={predictedRows} mode="amperes" />
        </div>
      </div>
      <table className="w-full text-left" data-testid="prediction-table">
        <thead className="text-ink-muted">
          <tr>
            <th className="py-1 pr-2">Order</th>
            <th className="py-1 pr-2 text-right">Measured (A)</th>
            <th className="py-1 pr-2 text-right">Predicted (A)</th>
            <th className="py-1 pr-2 text-right">Table limit (A)</th>
            {rowUnit !== "A" && <th className="py-1 pr-2 text-right">Table limit ({rowUnit})</th>}
            <th className="py-1">Verdict measured → predicted</th>
          </tr>
        </thead>
        <tbody>
          {orders.map((h) => {
            const m = measuredByOrder.get(h.order);
            const p = predictedByOrder.get(h.order);
            return (
              <tr key={h.order} className="border-t border-line" data-testid={`prediction-row-${h.order}`}>
                <td className="py-1 pr-2">{h.order}</td>
                <td className="py-1 pr-2 text-right tabular-nums">{fmt(h.measuredRms)}</td>
                <td className="py-1 pr-2 text-right tabular-nums">{fmt(h.rms)}</td>
                <td className="py-1 pr-2 text-right tabular-nums">{fmt(limitA(m ? tableLimitOf(m) : null))}</td>
                {rowUnit !== "A" && <td className="py-1 pr-2 text-right tabular-nums">{fmt(m ? tableLimitOf(m) : null)}</td>}
                <td className="py-1">
                  {m ? <VerdictBadge verdict={m.verdict} /> : "—"} → {p ? <VerdictBadge verdict={p.verdict} /> : "—"}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
      {predictedChannel.filters.map((f, k) => (
        <p key={k} className="text-ink-soft">
          {f.kind === "passive-filter"
            ? `Filter: parallel resonance with the source near order ${f.parallelResonanceOrder?.toFixed(2)}; capacitor duty rms V ${f.capacitorDuty?.rmsVoltagePercent.toFixed(0)} %, peak V ${f.capacitorDuty?.peakVoltagePercent.toFixed(0)} %, rms I ${f.capacitorDuty?.rmsCurrentPercent.toFixed(0)} %, kvar ${f.capacitorDuty?.kvarPercent.toFixed(0)} % of rating (IEEE Std 18-2012 limits 110/120/180/135 %).`
            : `Active filter: ${f.ratingUsedA?.toFixed(1)} A used (${f.ratingUsedPercent?.toFixed(0)} % of its rating).`}
        </p>
      ))}
      {result.warnings.length > 0 && (
        <ul className="list-disc pl-5 text-caution" data-testid="prediction-warnings">
          {result.warnings.map((w) => <li key={w}>{w}</li>)}
        </ul>
      )}
      <details className="text-ink-soft">
        <summary className="cursor-pointer">Assumptions</summary>
        <ul className="list-disc pl-5">
          {result.assumptions.map((a) => <li key={a}>{a}</li>)}
        </ul>
      </details>
      <p className="text-ink-muted" data-testid="prediction-caution">{result.caution}</p>
    </div>
  );
}

function SaveStudy({ base, evaluationId, inputs }: { base: string; evaluationId: string | null; inputs: MitigationStudyInputs }) {
  const { data } = useMitigationStudies(base);
  const [title, setTitle] = useState("");
  const [includeInReport, setInclude] = useState(true);
  const [message, setMessage] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  if (!data?.canSave) return null;
  async function save(e: React.FormEvent) {
    e.preventDefault();
    setBusy(true);
    setMessage(null);
    try {
      await sendJson(`${base}/studies`, "POST", { title, includeInReport, inputs, ...(evaluationId ? { evaluationId } : {}) });
      setMessage("Study saved.");
      setTitle("");
      await mutate(captureStudiesKey(base));
    } catch (err) {
      setMessage(err instanceof Error ? err.message : "The study was not saved.");
    } finally {
      setBusy(false);
    }
  }
  return (
    <form onSubmit={save} className="mt-3 flex flex-wrap items-center gap-3 border-t border-line pt-3" data-testid="save-study">
      <input value={title} onChange={(e) => setTitle(e.target.value)} placeholder="Study title" className="field-input w-72 py-1" data-testid="study-title" aria-label="Study title" />
      <label className="flex items-center gap-2">
        <input type="checkbox" checked={includeInReport} onChange={(e) => setInclude(e.target.checked)} className="h-4 w-4 accent-copper" data-testid="study-include" />
        include in the PDF report
      </label>
      <button type="submit" className="btn-primary" disabled={busy} data-testid="study-save">
        Save study
      </button>
      {message && <span role="status" data-testid="study-message">{message}</span>}
    </form>
  );
}

/** Where a saved study started from, as the list shows it beside the study. */
function startedFrom(study: SavedStudyDto, shownId: string | null, approvedId: string | null): { text: string; elsewhere: boolean } {
  if (!study.evaluationId || !study.evaluationCreatedAt) return { text: "starting evaluation not recorded", elsewhere: true };
  const when = formatWhen(new Date(study.evaluationCreatedAt));
  const approved = study.evaluationId === approvedId ? "approved " : "";
  if (study.evaluationId === shownId) return { text: `from this sheet's ${approved}evaluation (${when})`, elsewhere: false };
  return { text: `from another ${approved}evaluation (${when})`, elsewhere: true };
}

function SavedStudies({ base, evaluationId }: { base: string; evaluationId: string | null }) {
  const { data, error } = useMitigationStudies(base);
  // The sheet without ?evaluation= shows its default (approved, else newest): the studies of the approved one are "this sheet's".
  const shownId = evaluationId ?? data?.approvedEvaluationId ?? null;
  const captureHref = base.replace(/^\/api/, "");
  return (
    <section className="panel text-sm" data-testid="saved-studies" aria-labelledby="saved-studies-heading">
      <h2 id="saved-studies-heading" className="mb-2">Mitigation studies — predictions</h2>
      {error && <p className="text-fail">{error.message}</p>}
      {data && data.studies.length === 0 && <p className="text-ink-muted">No saved studies.</p>}
      <ul className="space-y-2">
        {data?.studies.map((s) => {
          const from = startedFrom(s, shownId, data.approvedEvaluationId);
          return (
            <li key={s.id} className="border-t border-line pt-2" data-testid="saved-study" data-evaluation={s.evaluationId ?? ""}>
              <div className="flex flex-wrap items-center gap-2">
                <span className="font-medium">{s.title}</span>
                {s.predictedVerdict !== "none" && <VerdictBadge verdict={s.predictedVerdict} />}
                <span className="text-ink-muted">predicted</span>
                {s.includeInReport && <span className="text-ink-muted">· in the PDF</span>}
              </div>
              <div className="text-ink-soft">
                {s.inputs.mitigations.map((m) => describeMitigation(m as Mitigation)).join(" + ")} · {s.authorName ?? "unknown"}, {formatWhen(new Date(s.createdAt))} · model {s.modelVersion}
              </div>
              <div className={from.elsewhere ? "text-caution" : "text-ink-soft"} data-testid="study-started-from">
                Starts {from.text}
                {from.elsewhere && s.evaluationId && (
                  <>
                    {" — "}
                    <a className="underline" href={`${captureHref}?evaluation=${s.evaluationId}`}>open that evaluation</a>
                  </>
                )}
              </div>
            </li>
          );
        })}
      </ul>
    </section>
  );
}
