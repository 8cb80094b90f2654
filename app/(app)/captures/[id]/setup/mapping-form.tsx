"use client";

import { useRouter } from "next/navigation";
import { useEffect, useState } from "react";
import type { EvaluationContext } from "@/lib/compliance/model";
import { fieldErrorsOf } from "@/lib/errors";
import { FetchError, sendJson } from "@/lib/swr/fetcher";
import { usePreview } from "@/lib/swr/use-preview";
import { captureSetupSchema, type CaptureMapping } from "@/lib/validations/capture";
import { ContextSection, numberOrUndefined, useContextState } from "./context-section";

interface Props {
  captureId: string;
  limitSets: { key: string; name: string }[];
  initialMapping: CaptureMapping;
  initialLimitSetKey: string;
  initialContext: EvaluationContext;
  siteFrequencyHz: number;
}

interface ChannelRow {
  name: string;
  header: string;
  column: number;
  include: boolean;
  quantity: "current" | "voltage";
  scale: string;
  phase: "" | "a" | "b" | "c";
  note: string | null;
}


export function MappingForm({ captureId, limitSets, initialMapping, initialLimitSetKey, initialContext, siteFrequencyHz }: Props) {
  const router = useRouter();
  const { data, error } = usePreview(captureId);
  const [rows, setRows] = useState<ChannelRow[]>([]);
  const [sampleInterval, setSampleInterval] = useState(initialMapping.sampleIntervalS?.toString() ?? "");
  const [frequency, setFrequency] = useState(initialMapping.frequencyHz?.toString() ?? String(siteFrequencyHz));
  const [thdMaxOrder, setThdMaxOrder] = useState(String(initialMapping.thdMaxOrder ?? 50));
  const contextState = useContextState(initialLimitSetKey, initialContext);
  const [errors, setErrors] = useState<Record<string, string[]>>({});
  const [message, setMessage] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  useEffect(() => {
    if (!data?.preview || rows.length > 0) return;
    setRows(
      data.preview.columns
        .filter((c) => c.role === "channel")
        .map((c) => {
          const saved = initialMapping.channels[c.name];
          return {
            name: c.name,
            header: c.header,
            column: c.column,
            include: !saved?.ignore,
            quantity: saved?.quantity ?? c.quantity ?? "current",
            scale: saved?.scale != null ? String(saved.scale) : "1",
            phase: (saved?.phase ?? c.phase ?? "") as ChannelRow["phase"],
            note: c.note,
          };
        }),
    );
  }, [data, rows.length, initialMapping.channels]);

  const update = (i: number, change: Partial<ChannelRow>) => setRows((rs) => rs.map((r, j) => (j === i ? { ...r, ...change } : r)));

  async function submit(e: React.FormEvent) {
    e.preventDefault();
    setMessage(null);
    const payload = {
      mapping: {
        channels: Object.fromEntries(
          rows.map((r) => [r.name, r.include ? { quantity: r.quantity, scale: numberOrUndefined(r.scale), phase: r.phase || null } : { ignore: true }]),
        ),
        sampleIntervalS: numberOrUndefined(sampleInterval),
        frequencyHz: frequency ? Number(frequency) : undefined,
        thdMaxOrder: Number(thdMaxOrder),
      },
      ...contextState.payload(),
    };
    const parsed = captureSetupSchema.safeParse(payload);
    if (!parsed.success) {
      setErrors(fieldErrorsOf(parsed.error));
      setMessage("Some fields need attention.");
      return;
    }
    if (!rows.some((r) => r.include)) return setMessage("Include at least one channel.");
    if (!data?.preview?.sampleIntervalS && parsed.data.mapping.sampleIntervalS === undefined) {
      setErrors({ "mapping.sampleIntervalS": ["The file states no sample interval: enter it"] });
      return;
    }
    setErrors({});
    setBusy(true);
    try {
      await sendJson(`/api/captures/${captureId}/setup`, "PUT", parsed.data);
      await sendJson(`/api/captures/${captureId}/analyze`, "POST");
      router.push(`/captures/${captureId}`);
      router.refresh();
    } catch (err) {
      if (err instanceof FetchError && err.fieldErrors) setErrors(err.fieldErrors);
      setMessage(err instanceof Error ? err.message : "Could not start the analysis.");
      setBusy(false);
    }
  }

  const err = (k: string) => errors[k]?.map((m) => <p key={m} className="field-error">{m}</p>);

  return (
    <form onSubmit={submit} className="space-y-4" noValidate data-testid="mapping-form">
      <section className="panel space-y-2">
        <h2>File preview</h2>
        {error && <p className="text-sm text-fail">{error.message}</p>}
        {!data && !error && <p className="text-sm text-ink-muted">Reading the first lines…</p>}
        {data && (
          <>
            <pre className="max-h-48 overflow-auto rounded bg-paper-sunk p-2 font-mono text-2xs leading-4" data-testid="preview-lines">
              {data.firstLines.join("\n")}
            </pre>
            {data.problem && (
              <p className="rounded bg-fail-light px-3 py-2 text-sm text-fail" role="alert">
                {data.problem}
              </p>
            )}
            {data.preview && (
              <p className="text-xs text-ink-muted">
                Delimiter “{data.preview.delimiter === "\t" ? "tab" : data.preview.delimiter}”, decimal “{data.preview.decimalSeparator}”,
                {data.preview.headerLine ? ` header on line ${data.preview.headerLine},` : " no header,"} data from line {data.preview.dataStartLine}.{" "}
                {data.preview.sampleIntervalS
                  ? `Sample interval ${(data.preview.sampleIntervalS * 1e6).toPrecision(5)} µs (${data.preview.sampleIntervalSource === "time-column" ? "time column" : "preamble"}).`
                  : "No sample interval found in the file."}
              </p>
            )}
          </>
        )}
      </section>

      {rows.length > 0 && (
        <section className="panel space-y-2">
          <h2>Channels</h2>
          <div className="overflow-x-auto">
            <table className="table-base" data-testid="channel-table">
              <thead>
                <tr><th>Use</th><th>Column</th><th>Quantity</th><th>Scale (CT/PT ratio, probe factor)</th><th>Phase</th></tr>
              </thead>
              <tbody>
                {rows.map((r, i) => (
                  <tr key={r.name}>
                    <td><input type="checkbox" aria-label={`Use ${r.name}`} checked={r.include} onChange={(e) => update(i, { include: e.target.checked })} /></td>
                    <td>
                      <span className="font-medium">{r.header}</span>
                      <span className="block text-2xs text-ink-muted">column {r.column}{r.note ? ` · ${r.note}` : ""}</span>
                    </td>
                    <td>
                      <select aria-label={`Quantity of ${r.name}`} className="rounded border border-line bg-paper-raised px-2 py-1" value={r.quantity} onChange={(e) => update(i, { quantity: e.target.value as ChannelRow["quantity"] })}>
                        <option value="current">Current (A)</option>
                        <option value="voltage">Voltage (V)</option>
                      </select>
                    </td>
                    <td>
                      <input aria-label={`Scale of ${r.name}`} inputMode="decimal" className="w-24 rounded border border-line bg-paper-raised px-2 py-1" value={r.scale} onChange={(e) => update(i, { scale: e.target.value })} />
                      {err(`mapping.channels.${r.name}.scale`)}
                    </td>
                    <td>
                      <select aria-label={`Phase of ${r.name}`} className="rounded border border-line bg-paper-raised px-2 py-1" value={r.phase} onChange={(e) => update(i, { phase: e.target.value as ChannelRow["phase"] })}>
                        <option value="">—</option>
                        <option value="a">L1 / A</option>
                        <option value="b">L2 / B</option>
                        <option value="c">L3 / C</option>
                      </select>
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
          <div className="grid gap-3 sm:grid-cols-3">
            <div>
              <label htmlFor="m-interval" className="field-label">Sample interval (s)</label>
              <input id="m-interval" inputMode="decimal" className="field-input" value={sampleInterval} onChange={(e) => setSampleInterval(e.target.value)} placeholder={data?.preview?.sampleIntervalS ? "from the file" : "required"} />
              {err("mapping.sampleIntervalS")}
            </div>
            <div>
              <label htmlFor="m-frequency" className="field-label">Nominal frequency</label>
              <select id="m-frequency" className="field-input" value={frequency} onChange={(e) => setFrequency(e.target.value)}>
                <option value="">Detect</option>
                <option value="50">50 Hz</option>
                <option value="60">60 Hz</option>
              </select>
            </div>
            <div>
              <label htmlFor="m-thd" className="field-label">THD up to order</label>
              <select id="m-thd" className="field-input" value={thdMaxOrder} onChange={(e) => setThdMaxOrder(e.target.value)}>
                <option value="40">40 (IEC 61000-3-2/-3-12)</option>
                <option value="50">50 (IEEE 519, IEC 61000-4-30)</option>
              </select>
            </div>
          </div>
        </section>
      )}

      <ContextSection state={contextState} limitSets={limitSets} errors={errors} />

      {message && <p className="rounded bg-fail-light px-3 py-2 text-sm text-fail" role="alert">{message}</p>}
      <button type="submit" className="btn-primary" disabled={busy || !data} data-testid="run-analysis">
        {busy ? "Starting…" : "Save and analyse"}
      </button>
    </form>
  );
}
