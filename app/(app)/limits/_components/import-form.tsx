"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { mutate } from "swr";
import { SubmitButton } from "@/app/_components/submit-button";
import { FetchError, sendJson } from "@/lib/swr/fetcher";
import { limitSetKey, limitSetRevisionsKey, limitSetsKey } from "@/lib/swr/use-limit-sets";
import { allMessages, importLimitSetSchema, labelledFieldErrors } from "@/lib/validations/limit-set";
import { ErrorList } from "./error-list";

// Import an exported document { key, name, content }: a new key makes a custom set, an existing key a new revision.
export function ImportForm() {
  const router = useRouter();
  const [text, setText] = useState("");
  const [reason, setReason] = useState("");
  const [errors, setErrors] = useState<string[]>([]);
  const [busy, setBusy] = useState(false);

  async function loadFile(e: React.ChangeEvent<HTMLInputElement>) {
    const file = e.target.files?.[0];
    if (file) setText(await file.text());
  }

  async function submit(e: React.FormEvent) {
    e.preventDefault();
    let doc: unknown;
    try {
      doc = JSON.parse(text);
    } catch (err) {
      return setErrors([`JSON: ${err instanceof Error ? err.message : "not valid JSON"}`]);
    }
    const body = doc !== null && typeof doc === "object" && reason.trim() ? { ...doc, reason } : doc;
    const parsed = importLimitSetSchema.safeParse(body);
    if (!parsed.success) return setErrors(allMessages(labelledFieldErrors(parsed.error, body)));
    setErrors([]);
    setBusy(true);
    try {
      const res = await sendJson<{ created: boolean; limitSet: { key: string } }>("/api/limit-sets/import", "POST", parsed.data);
      const key = res.limitSet.key;
      await Promise.all([mutate(limitSetsKey), mutate(limitSetKey(key)), mutate(limitSetRevisionsKey(key))]);
      router.push(res.created ? `/limits/${key}` : `/limits/${key}/revisions`);
    } catch (err) {
      setErrors(err instanceof FetchError && err.fieldErrors ? allMessages(err.fieldErrors) : [err instanceof Error ? err.message : "Import failed."]);
    } finally {
      setBusy(false);
    }
  }

  return (
    <form onSubmit={submit} className="panel space-y-3" noValidate data-testid="import-form">
      <h2>Import from JSON</h2>
      <p className="text-sm text-ink-soft">
        An exported document <code className="font-mono text-xs">{"{ key, name, content }"}</code>. A new key creates a custom set; an existing key
        gets a new revision and needs a reason.
      </p>
      <div>
        <label htmlFor="import-file" className="field-label">File</label>
        <input id="import-file" type="file" accept="application/json,.json" onChange={loadFile} className="mt-1 block w-full text-sm" />
      </div>
      <div>
        <label htmlFor="import-json" className="field-label">JSON</label>
        <textarea id="import-json" rows={6} className="field-input font-mono text-xs" value={text} onChange={(e) => setText(e.target.value)} spellCheck={false} data-testid="import-json" />
      </div>
      <div>
        <label htmlFor="import-reason" className="field-label">Reason (required when the key exists)</label>
        <input id="import-reason" className="field-input" value={reason} onChange={(e) => setReason(e.target.value)} />
      </div>
      <ErrorList messages={errors} testId="import-errors" />
      <SubmitButton busy={busy} busyLabel="Importing…" disabled={text.trim() === ""}>
        Import
      </SubmitButton>
    </form>
  );
}
