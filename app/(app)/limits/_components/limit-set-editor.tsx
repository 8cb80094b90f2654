"use client";

import { useRouter } from "next/navigation";
import { useMemo, useState } from "react";
import { mutate } from "swr";
import { SubmitButton } from "@/app/_components/submit-button";
import {
  AggregateNameSchema,
  BasisSchema,
  LimitSetRevisionContentSchema,
  ParitySchema,
  PhaseConfigSchema,
  type LimitSetRevisionContent,
} from "@/lib/compliance/model";
import { FetchError, sendJson } from "@/lib/swr/fetcher";
import { limitSetKey, limitSetRevisionsKey, limitSetsKey } from "@/lib/swr/use-limit-sets";
import { allMessages, labelledFieldErrors, reviseLimitSetSchemaFor } from "@/lib/validations/limit-set";
import {
  emptyAggregate,
  emptyRow,
  fromDraft,
  rangeKeys,
  rangeLabels,
  toDraft,
  type AggregateDraft,
  type BandDraft,
  type ContentDraft,
  type RowDraft,
} from "./editor-draft";
import { BandList, BandListItem } from "./band-list";
import { ErrorList } from "./error-list";

type Errors = Record<string, string[]>;

const bases = BasisSchema.options;
const parities = ParitySchema.options;
const aggregateNames = AggregateNameSchema.options;
const phaseConfigs = PhaseConfigSchema.options;

/** Messages whose path is `prefix` or lies under it. */
function under(errors: Errors, prefix: string): string[] {
  return Object.entries(errors)
    .filter(([k]) => k === prefix || k.startsWith(`${prefix}.`))
    .flatMap(([, m]) => m);
}

function Messages({ messages, testId }: { messages: string[]; testId?: string }) {
  if (messages.length === 0) return null;
  return (
    <div data-testid={testId}>
      {messages.map((m, i) => (
        <p key={i} className="field-error break-words">{m}</p>
      ))}
    </div>
  );
}

function Field({ label, htmlFor, children, className = "" }: { label: string; htmlFor: string; children: React.ReactNode; className?: string }) {
  return (
    <div className={`min-w-0 ${className}`}>
      <label htmlFor={htmlFor} className="block text-2xs font-medium uppercase tracking-wide text-ink-muted">{label}</label>
      {children}
    </div>
  );
}

const inputClass = "field-input mt-0.5 px-2 py-1.5 aria-[invalid=true]:border-fail";

function Select<T extends string>({ id, value, options, onChange, invalid }: { id: string; value: T; options: readonly T[]; onChange: (v: T) => void; invalid?: boolean }) {
  return (
    <select id={id} data-testid={id} className={inputClass} value={value} aria-invalid={invalid} onChange={(e) => onChange(e.target.value as T)}>
      {options.map((o) => (
        <option key={o} value={o}>{o}</option>
      ))}
    </select>
  );
}

function TextInput({ id, value, onChange, invalid, mono, decimal }: { id: string; value: string; onChange: (v: string) => void; invalid?: boolean; mono?: boolean; decimal?: boolean }) {
  return (
    <input
      id={id}
      data-testid={id}
      className={`${inputClass} ${mono ? "font-mono" : ""}`}
      value={value}
      inputMode={decimal ? "decimal" : undefined}
      aria-invalid={invalid}
      spellCheck={false}
      onChange={(e) => onChange(e.target.value)}
    />
  );
}

function orderText(row: { from: string; to: string }): string {
  return row.from === row.to ? `h ${row.from}` : `h ${row.from}–${row.to}`;
}

function RowEditor({ row, b, r, errors, onChange, onRemove }: { row: RowDraft; b: number; r: number; errors: Errors; onChange: (patch: Partial<RowDraft>) => void; onRemove: () => void }) {
  const path = `content.bands.${b}.orderRows.${r}`;
  const bad = (f: string) => !!errors[`${path}.${f}`];
  const id = (f: string) => `b${b}-r${r}-${f}`;
  return (
    <BandListItem title={`Row ${r + 1} · ${orderText(row)}`} testId={`edit-row-${b}-${r}`} removeTestId={id("remove")} onRemove={onRemove}>
      <div className="grid grid-cols-2 gap-2 sm:grid-cols-4 lg:grid-cols-[4rem_4rem_8.5rem_6.5rem_minmax(8rem,1fr)_6rem_7rem_minmax(6rem,1fr)]">
        <Field label="From" htmlFor={id("from")}><TextInput id={id("from")} value={row.from} decimal invalid={bad("from")} onChange={(v) => onChange({ from: v })} /></Field>
        <Field label="To" htmlFor={id("to")}><TextInput id={id("to")} value={row.to} decimal invalid={bad("to")} onChange={(v) => onChange({ to: v })} /></Field>
        <Field label="Parity" htmlFor={id("parity")}><Select id={id("parity")} value={row.parity} options={parities} onChange={(v) => onChange({ parity: v })} /></Field>
        <Field label="Kind" htmlFor={id("mode")}><Select id={id("mode")} value={row.mode} options={["limit", "formula"] as const} onChange={(v) => onChange({ mode: v })} /></Field>
        <Field label={row.mode === "formula" ? "Formula of h, P, lambda" : "Limit"} htmlFor={id("value")} className="col-span-2 sm:col-span-1">
          <TextInput id={id("value")} value={row.value} mono={row.mode === "formula"} decimal={row.mode === "limit"} invalid={bad(row.mode) || bad("limit") || bad("formula")} onChange={(v) => onChange({ value: v })} />
        </Field>
        <Field label="Basis" htmlFor={id("basis")}><Select id={id("basis")} value={row.basis} options={bases} onChange={(v) => onChange({ basis: v })} /></Field>
        <Field label="Cap" htmlFor={id("capMode")}>
          <Select id={id("capMode")} value={row.capMode} options={["none", "capA", "capFormulaA"] as const} onChange={(v) => onChange({ capMode: v })} />
        </Field>
        {row.capMode !== "none" && (
          <Field label={row.capMode === "capA" ? "Cap (A)" : "Cap formula (A)"} htmlFor={id("cap")}>
            <TextInput id={id("cap")} value={row.cap} mono={row.capMode === "capFormulaA"} decimal={row.capMode === "capA"} invalid={bad(row.capMode)} onChange={(v) => onChange({ cap: v })} />
          </Field>
        )}
      </div>
      <Messages messages={under(errors, path)} testId={`errors-${id("row")}`} />
    </BandListItem>
  );
}

function AggregateEditor({ agg, b, a, errors, onChange, onRemove }: { agg: AggregateDraft; b: number; a: number; errors: Errors; onChange: (patch: Partial<AggregateDraft>) => void; onRemove: () => void }) {
  const path = `content.bands.${b}.aggregates.${a}`;
  const bad = (f: string) => !!errors[`${path}.${f}`];
  const id = (f: string) => `b${b}-a${a}-${f}`;
  return (
    <BandListItem title={`Aggregate ${a + 1} · ${agg.name}`} testId={`edit-aggregate-${b}-${a}`} onRemove={onRemove}>
      <div className="grid grid-cols-2 gap-2 sm:grid-cols-4 lg:grid-cols-[6rem_4rem_4rem_8.5rem_6rem_9rem_minmax(6rem,1fr)_6rem_10rem]">
        <Field label="Name" htmlFor={id("name")}><Select id={id("name")} value={agg.name} options={aggregateNames} onChange={(v) => onChange({ name: v })} /></Field>
        <Field label="From" htmlFor={id("from")}><TextInput id={id("from")} value={agg.from} decimal invalid={bad("from")} onChange={(v) => onChange({ from: v })} /></Field>
        <Field label="To" htmlFor={id("to")}><TextInput id={id("to")} value={agg.to} decimal invalid={bad("to")} onChange={(v) => onChange({ to: v })} /></Field>
        <Field label="Parity" htmlFor={id("parity")}><Select id={id("parity")} value={agg.parity} options={parities} onChange={(v) => onChange({ parity: v })} /></Field>
        <Field label="Weighting" htmlFor={id("weighting")}><Select id={id("weighting")} value={agg.weighting} options={["none", "order"] as const} onChange={(v) => onChange({ weighting: v })} /></Field>
        <Field label="Kind" htmlFor={id("mode")}><Select id={id("mode")} value={agg.mode} options={["limit", "formula", "fromOrderLimits"] as const} onChange={(v) => onChange({ mode: v })} /></Field>
        {agg.mode !== "fromOrderLimits" ? (
          <Field label={agg.mode === "formula" ? "Formula of P, lambda" : "Limit"} htmlFor={id("value")}>
            <TextInput id={id("value")} value={agg.value} mono={agg.mode === "formula"} decimal={agg.mode === "limit"} invalid={bad(agg.mode)} onChange={(v) => onChange({ value: v })} />
          </Field>
        ) : (
          <p className="self-end pb-2 text-xs text-ink-muted">sum over the order limits</p>
        )}
        <Field label="Basis" htmlFor={id("basis")}><Select id={id("basis")} value={agg.basis} options={bases} onChange={(v) => onChange({ basis: v })} /></Field>
        <Field label="Role" htmlFor={id("role")}><Select id={id("role")} value={agg.role} options={["requirement", "allowance-condition"] as const} onChange={(v) => onChange({ role: v })} /></Field>
      </div>
      <Messages messages={under(errors, path)} />
    </BandListItem>
  );
}

function BandEditor({ band, b, errors, update }: { band: BandDraft; b: number; errors: Errors; update: (fn: (band: BandDraft) => void) => void }) {
  const path = `content.bands.${b}`;
  const ownErrors = [...(errors[path] ?? []), ...(errors[`${path}.label`] ?? []), ...under(errors, `${path}.applicability`)];
  return (
    <section className="panel space-y-4" data-testid={`band-editor-${b}`}>
      <div>
        <label htmlFor={`b${b}-label`} className="field-label">Band label</label>
        <input id={`b${b}-label`} className="field-input" value={band.label} aria-invalid={!!errors[`${path}.label`]} onChange={(e) => update((d) => void (d.label = e.target.value))} />
      </div>
      <fieldset className="space-y-2">
        <legend className="text-sm font-semibold">Applicability</legend>
        <p className="text-xs text-ink-muted">Leave min and max empty where the criterion does not apply.</p>
        <div className="grid gap-3 md:grid-cols-2">
          {rangeKeys.map((k) => {
            const r = band.ranges[k];
            const id = `b${b}-${k}`;
            const bad = (f: string) => !!errors[`${path}.applicability.${k}.${f}`] || !!errors[`${path}.applicability.${k}`];
            const set = (patch: Partial<typeof r>) => update((d) => void (d.ranges[k] = { ...d.ranges[k], ...patch }));
            return (
              <div key={k} className="rounded-md border border-line/70 p-2">
                <p className="text-xs font-medium text-ink-soft">{rangeLabels[k]}</p>
                <div className="grid grid-cols-2 gap-2">
                  <Field label="Min" htmlFor={`${id}-min`}><TextInput id={`${id}-min`} value={r.min} decimal invalid={bad("min")} onChange={(v) => set({ min: v })} /></Field>
                  <Field label="Max" htmlFor={`${id}-max`}><TextInput id={`${id}-max`} value={r.max} decimal invalid={bad("max")} onChange={(v) => set({ max: v })} /></Field>
                  <label className="flex items-center gap-1.5 text-xs">
                    <input type="checkbox" checked={r.minInclusive} onChange={(e) => set({ minInclusive: e.target.checked })} /> min included
                  </label>
                  <label className="flex items-center gap-1.5 text-xs">
                    <input type="checkbox" checked={r.maxInclusive} onChange={(e) => set({ maxInclusive: e.target.checked })} /> max included
                  </label>
                </div>
              </div>
            );
          })}
        </div>
        <div className="flex flex-wrap gap-x-4 gap-y-1 text-sm">
          <span className="text-xs font-medium text-ink-soft">Phase configuration (none ticked = any):</span>
          {phaseConfigs.map((p) => (
            <label key={p} className="flex items-center gap-1.5 text-xs">
              <input
                type="checkbox"
                checked={band.phaseConfig.includes(p)}
                onChange={(e) => update((d) => void (d.phaseConfig = e.target.checked ? [...d.phaseConfig, p] : d.phaseConfig.filter((x) => x !== p)))}
              />
              {p}
            </label>
          ))}
        </div>
      </fieldset>
      <Messages messages={ownErrors} testId={`errors-band-${b}`} />
      <BandList title="Order rows" items={band.rows} select={(d) => d.rows} empty={(d) => emptyRow(d.rows.at(-1)?.basis)} addLabel="Add row" addTestId={`b${b}-add-row`} update={update}>
        {(row, r, edit) => <RowEditor key={row.id} row={row} b={b} r={r} errors={errors} {...edit} />}
      </BandList>
      <BandList title="Aggregates" items={band.aggregates} select={(d) => d.aggregates} empty={(d) => emptyAggregate(d.rows.at(-1)?.basis)} addLabel="Add aggregate" update={update}>
        {(agg, a, edit) => <AggregateEditor key={agg.id} agg={agg} b={b} a={a} errors={errors} {...edit} />}
      </BandList>
    </section>
  );
}

type Parsed = { ok: true; content: unknown } | { ok: false; message: string };

function parseJson(text: string): Parsed {
  try {
    return { ok: true, content: JSON.parse(text) as unknown };
  } catch (err) {
    return { ok: false, message: `JSON: ${err instanceof Error ? err.message : "not valid JSON"}` };
  }
}

// The admin's editor for one limit set: a structured form for bands, rows and aggregates, or the
// whole content as JSON; both validated by the same schema the route handler uses.
export function LimitSetEditor({ setKey, content, revisionNumber }: { setKey: string; content: LimitSetRevisionContent; revisionNumber: number }) {
  const router = useRouter();
  const schema = useMemo(() => reviseLimitSetSchemaFor(setKey), [setKey]);
  const [mode, setMode] = useState<"form" | "json">("form");
  const [draft, setDraft] = useState<ContentDraft>(() => toDraft(content));
  const [jsonText, setJsonText] = useState("");
  const [reason, setReason] = useState("");
  const [submitted, setSubmitted] = useState(false);
  const [serverErrors, setServerErrors] = useState<Errors>({});
  const [formError, setFormError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  // Validated on every change, so each field shows its problem as soon as it is typed.
  const check = useMemo(() => {
    const parsed: Parsed = mode === "json" ? parseJson(jsonText) : { ok: true, content: fromDraft(draft) };
    if (!parsed.ok) return { body: null, errors: { "content": [parsed.message] } as Errors };
    const body = { content: parsed.content, reason };
    const result = schema.safeParse(body);
    return result.success ? { body: result.data, errors: {} as Errors } : { body: null, errors: labelledFieldErrors(result.error, body) };
  }, [mode, jsonText, draft, reason, schema]);

  // The reason is only nagged about once the admin tries to save.
  const shown: Errors = { ...(submitted ? check.errors : Object.fromEntries(Object.entries(check.errors).filter(([k]) => k !== "reason"))), ...serverErrors };

  const updateBand = (b: number) => (fn: (band: BandDraft) => void) => {
    setServerErrors({});
    setDraft((d) => {
      const copy = structuredClone(d);
      fn(copy.bands[b]!);
      return copy;
    });
  };

  function switchMode() {
    setServerErrors({});
    if (mode === "form") {
      setJsonText(JSON.stringify(fromDraft(draft), null, 2));
      setMode("json");
      return;
    }
    const parsed = parseJson(jsonText);
    if (!parsed.ok) return setFormError(parsed.message);
    const result = LimitSetRevisionContentSchema.safeParse(parsed.content);
    if (!result.success) {
      return setFormError("Fix the JSON before going back to the form: " + allMessages(labelledFieldErrors(result.error, parsed.content, "")).join(" · "));
    }
    setFormError(null);
    setDraft(toDraft(result.data));
    setMode("form");
  }

  async function save(e: React.FormEvent) {
    e.preventDefault();
    setSubmitted(true);
    setFormError(null);
    setServerErrors({});
    if (!check.body) return;
    setBusy(true);
    try {
      await sendJson(`/api/limit-sets/${setKey}`, "PUT", check.body);
      await Promise.all([mutate(limitSetKey(setKey)), mutate(limitSetRevisionsKey(setKey)), mutate(limitSetsKey)]);
      router.push(`/limits/${setKey}/revisions`);
    } catch (err) {
      if (err instanceof FetchError && err.fieldErrors) setServerErrors(err.fieldErrors);
      setFormError(err instanceof Error ? err.message : "Could not save the revision.");
    } finally {
      setBusy(false);
    }
  }

  const summary = submitted || Object.keys(serverErrors).length > 0 ? allMessages(shown) : [];

  return (
    <form onSubmit={save} className="space-y-4" noValidate data-testid="limit-set-editor">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <p className="text-sm text-ink-soft">
          Editing revision {revisionNumber}. Saving makes revision {revisionNumber + 1}, which becomes current; revision {revisionNumber} stays as it is.
        </p>
        <button type="button" className="btn-quiet" onClick={switchMode} data-testid="json-toggle">
          {mode === "form" ? "Advanced: edit as JSON" : "Back to the form"}
        </button>
      </div>

      {mode === "form" ? (
        <>
          <div className="panel space-y-2">
            <label htmlFor="limit-set-notes" className="field-label">Interpretation notes (one per line)</label>
            <p className="text-xs text-ink-muted">
              Choices the printed standard leaves open, in plain words for a customer (e.g. which row a value on a boundary uses). Printed once under Notes on every sheet and PDF judged with this revision.
            </p>
            <textarea
              id="limit-set-notes"
              data-testid="notes-editor"
              rows={Math.min(10, Math.max(3, draft.notesText.split("\n").length + 1))}
              className="field-input"
              value={draft.notesText}
              onChange={(e) => {
                setServerErrors({});
                const notesText = e.target.value;
                setDraft((d) => ({ ...d, notesText }));
              }}
            />
            <Messages messages={under(shown, "content.notes")} testId="notes-errors" />
          </div>
          {draft.bands.map((band, b) => <BandEditor key={band.id} band={band} b={b} errors={shown} update={updateBand(b)} />)}
        </>
      ) : (
        <div className="panel space-y-2">
          <label htmlFor="content-json" className="field-label">Revision content (JSON)</label>
          <p className="text-xs text-ink-muted">
            The whole revision: meta, bands with rows and aggregates, rules. Checked against the same schema as the form.
          </p>
          <textarea
            id="content-json"
            data-testid="json-editor"
            rows={24}
            className="field-input font-mono text-xs"
            value={jsonText}
            spellCheck={false}
            aria-invalid={Object.keys(check.errors).some((k) => k.startsWith("content"))}
            onChange={(e) => {
              setServerErrors({});
              setJsonText(e.target.value);
            }}
          />
          <Messages messages={under(shown, "content")} testId="json-errors" />
        </div>
      )}

      <div className="panel space-y-3">
        <div>
          <label htmlFor="revision-reason" className="field-label">Reason for this revision (required)</label>
          <input
            id="revision-reason"
            data-testid="revision-reason-input"
            className="field-input"
            value={reason}
            aria-invalid={!!shown.reason}
            placeholder="e.g. Corrected order 5 to the utility's connection agreement"
            onChange={(e) => setReason(e.target.value)}
          />
          {shown.reason?.map((m) => <p key={m} className="field-error">{m}</p>)}
        </div>
        <ErrorList messages={summary} testId="editor-errors" />
        {formError && <p className="rounded bg-fail-light px-3 py-2 text-sm text-fail" role="alert">{formError}</p>}
        <div className="flex flex-wrap gap-2">
          <SubmitButton busy={busy} busyLabel="Saving…" testId="save-revision">
            {`Save as revision ${revisionNumber + 1}`}
          </SubmitButton>
          <button type="button" className="btn-quiet" onClick={() => router.push(`/limits/${setKey}`)}>Cancel</button>
        </div>
      </div>
    </form>
  );
}
