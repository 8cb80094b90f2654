"use client";

import { useEffect, useState } from "react";
import type { EvaluationContext } from "@/lib/compliance/model";
import type { IntervalMappingInput } from "@/lib/intervals/types";
import { fieldErrorsOf } from "@/lib/errors";
import { useIntervalPreview } from "@/lib/swr/use-interval-preview";
import { intervalSetupSchema } from "@/lib/validations/capture";
import { ContextSection, numberOrUndefined, useContextState } from "./context-section";
import { FilePreview } from "./file-preview";
import { SetupSubmit } from "./setup-submit";
import { useSaveAndAnalyze } from "./use-save-and-analyze";

interface Row {
  column: string;
  use: boolean;
  channel: string;
  quantity: "current" | "voltage";
  kind: "order" | "rms" | "thd";
  order: string;
  unit: "A" | "V" | "%";
  scale: string;
  missing: string[];
}

interface Props {
  captureId: string;
  limitSets: { key: string; name: string }[];
  /** The capture's saved mapping, else the one remembered for its site; null to use the suggestion. */
  savedMapping: IntervalMappingInput | null;
  initialLimitSetKey: string;
  initialContext: EvaluationContext;
}

const sel = "rounded border border-line bg-paper-raised px-1.5 py-1";

export function IntervalMappingForm({ captureId, limitSets, savedMapping, initialLimitSetKey, initialContext }: Props) {
  const { data, error } = useIntervalPreview(captureId);
  const [rows, setRows] = useState<Row[]>([]);
  const [timestamp, setTimestamp] = useState("");
  const [format, setFormat] = useState<"auto" | "iso" | "ymd" | "dmy">("auto");
  const [offset, setOffset] = useState("0");
  const contextState = useContextState(initialLimitSetKey, initialContext);
  const { errors, setErrors, message, setMessage, busy, saveAndAnalyze } = useSaveAndAnalyze(captureId, "interval-setup", "Could not start the evaluation.");

  useEffect(() => {
    const preview = data?.preview;
    if (!preview || rows.length > 0) return;
    const headers = new Set(preview.headers);
    // A remembered mapping is used only when every column it names is in this file.
    const saved = savedMapping && savedMapping.columns.every((c) => headers.has(c.column)) && headers.has(savedMapping.timestamp.column) ? savedMapping : null;
    const suggestion = preview.suggestion;
    setTimestamp(saved?.timestamp.column ?? suggestion.timestamp?.column ?? preview.headers[0] ?? "");
    setFormat(saved?.timestamp.format ?? suggestion.timestamp?.format ?? "auto");
    setOffset(String(saved?.timestamp.utcOffsetMinutes ?? 0));
    setRows(
      suggestion.columns
        .filter((c) => c.role === "value" || c.role === "unknown")
        .map((c) => {
          const s = saved?.columns.find((m) => m.column === c.column);
          return {
            column: c.column,
            use: saved ? Boolean(s) : c.use,
            channel: s?.channel ?? c.channel ?? "",
            quantity: s?.quantity ?? c.quantity ?? "current",
            kind: s?.kind ?? c.kind ?? "order",
            order: String(s?.order ?? c.order ?? ""),
            unit: s?.unit ?? c.unit ?? "A",
            scale: String(s?.scale ?? c.scale ?? 1),
            missing: saved ? [] : c.missing,
          };
        }),
    );
  }, [data, rows.length, savedMapping]);

  const update = (i: number, change: Partial<Row>) => setRows((rs) => rs.map((r, j) => (j === i ? { ...r, ...change } : r)));

  async function submit(e: React.FormEvent) {
    e.preventDefault();
    setMessage(null);
    const used = rows.filter((r) => r.use);
    if (used.length === 0) return setMessage("Use at least one column.");
    const payload = {
      intervalMapping: {
        timestamp: { column: timestamp, format, utcOffsetMinutes: Number(offset) || 0 },
        columns: used.map((r) => ({
          column: r.column,
          channel: r.channel.trim(),
          quantity: r.quantity,
          kind: r.kind,
          ...(r.kind === "order" ? { order: numberOrUndefined(r.order) } : {}),
          unit: r.unit,
          scale: numberOrUndefined(r.scale) ?? 1,
        })),
      },
      ...contextState.payload(),
    };
    const parsed = intervalSetupSchema.safeParse(payload);
    if (!parsed.success) {
      const fe = fieldErrorsOf(parsed.error);
      // Name the column, not its index, in the message.
      const named = Object.entries(fe).map(([k, m]) => {
        const idx = /intervalMapping\.columns\.(\d+)/.exec(k);
        return `${idx ? `column “${used[Number(idx[1])]?.column}”` : k}: ${m.join("; ")}`;
      });
      setErrors(fe);
      setMessage(`Some fields need attention — ${named.join(" · ")}`);
      return;
    }
    await saveAndAnalyze(parsed.data);
  }

  return (
    <form onSubmit={submit} className="space-y-4" noValidate data-testid="interval-mapping-form">
      <FilePreview data={data} error={error} />

      {data?.preview && (
        <section className="panel space-y-3">
          <h2>Columns</h2>
          <p className="text-xs text-ink-muted">
            Suggestions come from the column names only; check each one. The mapping is remembered for this site.
          </p>
          <div className="grid gap-3 sm:grid-cols-3">
            <div>
              <label htmlFor="iv-ts" className="field-label">Timestamp column</label>
              <select id="iv-ts" className="field-input" value={timestamp} onChange={(e) => setTimestamp(e.target.value)}>
                {data.preview.headers.map((h) => <option key={h} value={h}>{h}</option>)}
              </select>
            </div>
            <div>
              <label htmlFor="iv-format" className="field-label">Timestamp format</label>
              <select id="iv-format" className="field-input" value={format} onChange={(e) => setFormat(e.target.value as typeof format)}>
                <option value="auto">Detect</option>
                <option value="iso">ISO 8601</option>
                <option value="ymd">YYYY-MM-DD HH:MM:SS</option>
                <option value="dmy">DD.MM.YYYY HH:MM:SS</option>
              </select>
            </div>
            <div>
              <label htmlFor="iv-offset" className="field-label">Offset of zone-less times (minutes east of UTC)</label>
              <input id="iv-offset" inputMode="numeric" className="field-input" value={offset} onChange={(e) => setOffset(e.target.value)} />
            </div>
          </div>
          <div className="overflow-x-auto">
            <table className="table-base" data-testid="interval-columns">
              <thead>
                <tr><th>Use</th><th>Column</th><th>Channel</th><th>Quantity</th><th>Holds</th><th>Order</th><th>Unit</th><th>Scale</th></tr>
              </thead>
              <tbody>
                {rows.map((r, i) => (
                  <tr key={r.column}>
                    <td><input type="checkbox" aria-label={`Use ${r.column}`} checked={r.use} onChange={(e) => update(i, { use: e.target.checked })} /></td>
                    <td className="whitespace-nowrap">
                      {r.column}
                      {r.missing.length > 0 && <span className="block text-2xs text-caution">not guessed: {r.missing.join(", ")}</span>}
                    </td>
                    <td><input aria-label={`Channel of ${r.column}`} className={`${sel} w-20`} value={r.channel} onChange={(e) => update(i, { channel: e.target.value })} /></td>
                    <td>
                      <select aria-label={`Quantity of ${r.column}`} className={sel} value={r.quantity} onChange={(e) => update(i, { quantity: e.target.value as Row["quantity"] })}>
                        <option value="current">Current</option>
                        <option value="voltage">Voltage</option>
                      </select>
                    </td>
                    <td>
                      <select aria-label={`Content of ${r.column}`} className={sel} value={r.kind} onChange={(e) => update(i, { kind: e.target.value as Row["kind"] })}>
                        <option value="order">Harmonic order</option>
                        <option value="rms">r.m.s.</option>
                        <option value="thd">THD</option>
                      </select>
                    </td>
                    <td>
                      {r.kind === "order" && (
                        <input aria-label={`Order of ${r.column}`} inputMode="numeric" className={`${sel} w-14`} value={r.order} onChange={(e) => update(i, { order: e.target.value })} />
                      )}
                    </td>
                    <td>
                      <select aria-label={`Unit of ${r.column}`} className={sel} value={r.unit} onChange={(e) => update(i, { unit: e.target.value as Row["unit"] })}>
                        <option value="A">A</option>
                        <option value="V">V</option>
                        <option value="%">% of fundamental</option>
                      </select>
                    </td>
                    <td><input aria-label={`Scale of ${r.column}`} inputMode="decimal" className={`${sel} w-16`} value={r.scale} onChange={(e) => update(i, { scale: e.target.value })} /></td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        </section>
      )}

      <ContextSection state={contextState} limitSets={limitSets} errors={errors} />
      <SetupSubmit message={message} busy={busy} ready={!!data?.preview} label="Save and evaluate" />
    </form>
  );
}
