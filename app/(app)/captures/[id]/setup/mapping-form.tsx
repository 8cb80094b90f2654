"use client";

import { useEffect, useState } from "react";
import type { EvaluationContext } from "@/lib/compliance/model";
import { fieldErrorsOf } from "@/lib/errors";
import { usePreview } from "@/lib/swr/use-preview";
import { parseSensorRating } from "@/lib/analysis/parse-sensor-rating";
import { parseUnit } from "@/lib/analysis/parse-unit";
import { captureSetupSchema, type CaptureMapping } from "@/lib/validations/capture";
import { ContextSection, numberOrUndefined, useContextState } from "./context-section";
import { FilePreview } from "./file-preview";
import { SetupSubmit } from "./setup-submit";
import { useSaveAndAnalyze } from "./use-save-and-analyze";

interface Props {
  captureId: string;
  limitSets: { key: string; name: string }[];
  initialMapping: CaptureMapping;
  initialLimitSetKey: string;
  initialContext: EvaluationContext;
  siteFrequencyHz: number;
}

type Choice = "current" | "voltage" | "time" | "ignore";

interface ColumnRow {
  name: string;
  header: string;
  column: number;
  /** The unit written in the file for this column (e.g. "mV"), null when none. */
  unit: string | null;
  choice: Choice;
  /** Whether the header said what the column is (else the row asks the user to choose). */
  recognised: boolean;
  scale: string;
  phase: "" | "a" | "b" | "c";
  note: string | null;
}

/** What the scale multiplies, in the row's own terms. */
function scaleMeaning(row: ColumnRow): string {
  const recorded = row.unit ? parseUnit(row.unit)?.baseUnit : undefined;
  if (row.choice === "current") {
    if (recorded === "V") return "amperes per volt of the recorded signal (clamp or shunt output)";
    if (recorded === "A") return "amperes per ampere recorded (CT ratio)";
    return "amperes per unit of the recorded signal";
  }
  if (recorded === "V") return "volts per volt recorded (PT ratio, probe factor)";
  return "volts per unit of the recorded signal";
}

const CHOICE_LABEL: Record<Choice, string> = { current: "Current (A)", voltage: "Voltage (V)", time: "Time axis", ignore: "Ignore" };

export function MappingForm({ captureId, limitSets, initialMapping, initialLimitSetKey, initialContext, siteFrequencyHz }: Props) {
  const { data, error } = usePreview(captureId);
  const [rows, setRows] = useState<ColumnRow[]>([]);
  const [sampleInterval, setSampleInterval] = useState(initialMapping.sampleIntervalS?.toString() ?? "");
  const [frequency, setFrequency] = useState(initialMapping.frequencyHz?.toString() ?? String(siteFrequencyHz));
  const [thdMaxOrder, setThdMaxOrder] = useState(String(initialMapping.thdMaxOrder ?? 50));
  const contextState = useContextState(initialLimitSetKey, initialContext);
  const { errors, setErrors, message, setMessage, busy, saveAndAnalyze } = useSaveAndAnalyze(captureId, "setup", "Could not start the analysis.");

  useEffect(() => {
    if (!data?.preview || rows.length > 0) return;
    setRows(
      data.preview.columns.map((c): ColumnRow => {
        const saved = initialMapping.channels[c.name] ?? initialMapping.channels[c.header];
        const recognised = c.role === "time" || c.quantity !== null;
        const detected: Choice = c.role === "time" ? "time" : (c.quantity ?? "ignore");
        const choice: Choice = saved?.ignore ? "ignore" : saved?.time ? "time" : (saved?.quantity ?? detected);
        return {
          name: c.name,
          header: c.header,
          column: c.column,
          unit: c.unit,
          choice,
          recognised,
          scale: saved?.scale != null ? String(saved.scale) : "1",
          phase: (saved?.phase ?? c.phase ?? "") as ColumnRow["phase"],
          note: c.role === "skipped" && !recognised ? null : c.note,
        };
      }),
    );
  }, [data, rows.length, initialMapping.channels]);

  const update = (i: number, change: Partial<ColumnRow>) => setRows((rs) => rs.map((r, j) => (j === i ? { ...r, ...change } : r)));

  async function submit(e: React.FormEvent) {
    e.preventDefault();
    setMessage(null);
    const fieldErrors: Record<string, string[]> = {};
    const channels: Record<string, unknown> = {};
    for (const r of rows) {
      if (r.choice === "ignore") channels[r.name] = { ignore: true };
      else if (r.choice === "time") channels[r.name] = { time: true };
      else {
        // The scale field takes a number or the sensor's rating ("10 mV/A"); the server gets the number.
        const rating = parseSensorRating(r.scale, r.choice);
        if (!rating.ok) fieldErrors[`mapping.channels.${r.name}.scale`] = [rating.message];
        channels[r.name] = { quantity: r.choice, scale: rating.ok ? rating.scale : undefined, phase: r.phase || null };
      }
    }
    const payload = {
      mapping: {
        channels,
        sampleIntervalS: numberOrUndefined(sampleInterval),
        frequencyHz: frequency ? Number(frequency) : undefined,
        thdMaxOrder: Number(thdMaxOrder),
      },
      ...contextState.payload(),
    };
    const parsed = captureSetupSchema.safeParse(payload);
    if (!parsed.success || Object.keys(fieldErrors).length > 0) {
      setErrors({ ...(parsed.success ? {} : fieldErrorsOf(parsed.error)), ...fieldErrors });
      setMessage("Some fields need attention.");
      return;
    }
    if (!rows.some((r) => r.choice === "current" || r.choice === "voltage")) {
      return setMessage("Choose Current or Voltage for at least one column: no column is analysed yet.");
    }
    if (rows.filter((r) => r.choice === "time").length > 1) return setMessage("Only one column can be the time axis.");
    const hasTime = rows.some((r) => r.choice === "time");
    if (!hasTime && !data?.preview?.sampleIntervalS && parsed.data.mapping.sampleIntervalS === undefined) {
      setErrors({ "mapping.sampleIntervalS": ["The file states no sample interval and no column is the time axis: enter the interval"] });
      return;
    }
    await saveAndAnalyze(parsed.data);
  }

  const err = (k: string) => errors[k]?.map((m) => <p key={m} className="field-error">{m}</p>);

  return (
    <form onSubmit={submit} className="space-y-4" noValidate data-testid="mapping-form">
      <FilePreview data={data} error={error}>
        {data?.preview && (
          <p className="text-xs text-ink-muted">
            Delimiter “{data.preview.delimiter === "\t" ? "tab" : data.preview.delimiter}”, decimal “{data.preview.decimalSeparator}”,
            {data.preview.headerLine ? ` header on line ${data.preview.headerLine},` : " no header,"} data from line {data.preview.dataStartLine}.{" "}
            {data.preview.sampleIntervalS
              ? `Sample interval ${(data.preview.sampleIntervalS * 1e6).toPrecision(5)} µs (${data.preview.sampleIntervalSource === "time-column" ? "time column" : "preamble"}).`
              : "No sample interval found in the file."}
          </p>
        )}
      </FilePreview>

      {rows.length > 0 && (
        <section className="panel space-y-2">
          <h2>Columns</h2>
          <p className="text-xs text-ink-muted">Every column of the file. Say what each one is; ignored columns are not analysed.</p>
          <div className="overflow-x-auto">
            <table className="table-base" data-testid="channel-table">
              <thead>
                <tr><th>Column</th><th>What it is</th><th>Scale or sensor rating</th><th>Phase</th></tr>
              </thead>
              <tbody>
                {rows.map((r, i) => {
                  const measured = r.choice === "current" || r.choice === "voltage";
                  const rating = r.choice === "current" || r.choice === "voltage" ? parseSensorRating(r.scale, r.choice) : null;
                  return (
                    <tr key={`${r.column}-${r.name}`} data-testid={`column-row-${r.column}`} data-recognised={r.recognised}>
                      <td>
                        <span className="font-medium">{r.header}</span>
                        <span className="block text-2xs text-ink-muted">column {r.column}{r.note ? ` · ${r.note}` : ""}</span>
                        {!r.recognised && (
                          <span className="block text-2xs text-caution" data-testid={`not-recognised-${r.column}`}>not recognised — choose what it is</span>
                        )}
                      </td>
                      <td>
                        <select aria-label={`Quantity of ${r.name}`} className="rounded border border-line bg-paper-raised px-2 py-1" value={r.choice} onChange={(e) => update(i, { choice: e.target.value as Choice })}>
                          {(Object.keys(CHOICE_LABEL) as Choice[]).map((k) => (
                            <option key={k} value={k}>{CHOICE_LABEL[k]}</option>
                          ))}
                        </select>
                      </td>
                      <td>
                        {measured && (
                          <>
                            <input aria-label={`Scale of ${r.name}`} className="w-28 rounded border border-line bg-paper-raised px-2 py-1" value={r.scale} onChange={(e) => update(i, { scale: e.target.value })} />
                            <span className="block text-2xs text-ink-muted">× {scaleMeaning(r)}; or the sensor&apos;s rating, e.g. 10 mV/A, 100:5</span>
                            {rating?.ok && rating.scale !== Number(r.scale) && <span className="block text-2xs text-ink-muted" data-testid={`scale-reading-${r.column}`}>{rating.explanation}</span>}
                            {err(`mapping.channels.${r.name}.scale`)}
                          </>
                        )}
                      </td>
                      <td>
                        {measured && (
                          <select aria-label={`Phase of ${r.name}`} className="rounded border border-line bg-paper-raised px-2 py-1" value={r.phase} onChange={(e) => update(i, { phase: e.target.value as ColumnRow["phase"] })}>
                            <option value="">—</option>
                            <option value="a">L1 / A</option>
                            <option value="b">L2 / B</option>
                            <option value="c">L3 / C</option>
                          </select>
                        )}
                      </td>
                    </tr>
                  );
                })}
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
      <SetupSubmit message={message} busy={busy} ready={!!data} label="Save and analyse" />
    </form>
  );
}
