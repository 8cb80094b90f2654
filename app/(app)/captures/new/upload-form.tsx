"use client";

import { useRouter } from "next/navigation";
import { useRef, useState } from "react";
import { fieldErrorsOf } from "@/lib/errors";
import { FetchError, sendJson } from "@/lib/swr/fetcher";
import { registerCaptureSchema } from "@/lib/validations/capture";

interface Props {
  sites: { id: string; name: string }[];
  defaultSiteId?: string;
  maxBytes: number;
}

type Phase = { kind: "idle" } | { kind: "uploading"; percent: number } | { kind: "finishing" };

interface PresignedUpload {
  url: string;
  fields: Record<string, string>;
}

/** Posts the file straight to the bucket with the presigned form policy (fields first, the file last), reporting progress. */
function postWithProgress(upload: PresignedUpload, file: File, onProgress: (percent: number) => void, xhrRef: React.RefObject<XMLHttpRequest | null>) {
  return new Promise<void>((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhrRef.current = xhr;
    const form = new FormData();
    for (const [k, v] of Object.entries(upload.fields)) form.append(k, v);
    form.append("file", file);
    xhr.open("POST", upload.url);
    xhr.upload.onprogress = (e) => e.lengthComputable && onProgress(Math.round((e.loaded / e.total) * 100));
    xhr.onload = () => (xhr.status >= 200 && xhr.status < 300 ? resolve() : reject(new Error(`Storage refused the upload (HTTP ${xhr.status}).`)));
    xhr.onerror = () => reject(new Error("The upload failed: the storage service could not be reached."));
    xhr.onabort = () => reject(new DOMException("Upload cancelled", "AbortError"));
    xhr.send(form);
  });
}

export function UploadForm({ sites, defaultSiteId, maxBytes }: Props) {
  const router = useRouter();
  const [file, setFile] = useState<File | null>(null);
  const [siteId, setSiteId] = useState(defaultSiteId ?? sites[0]?.id ?? "");
  const [title, setTitle] = useState("");
  const [kind, setKind] = useState<"waveform" | "interval-log">("waveform");
  const [errors, setErrors] = useState<Record<string, string[]>>({});
  const [message, setMessage] = useState<string | null>(null);
  const [phase, setPhase] = useState<Phase>({ kind: "idle" });
  const [dragging, setDragging] = useState(false);
  const xhrRef = useRef<XMLHttpRequest | null>(null);
  const maxMb = Math.round(maxBytes / 1024 / 1024);

  function choose(f: File | undefined) {
    if (!f) return;
    setFile(f);
    if (!title) setTitle(f.name.replace(/\.[^.]+$/, ""));
  }

  async function submit(e: React.FormEvent) {
    e.preventDefault();
    setMessage(null);
    const parsed = registerCaptureSchema.safeParse({ siteId, kind, title, filename: file?.name ?? "", sizeBytes: file?.size ?? 0 });
    if (!file) return setErrors({ filename: ["Choose a CSV file"] });
    if (!parsed.success) return setErrors(fieldErrorsOf(parsed.error));
    setErrors({});
    try {
      setPhase({ kind: "uploading", percent: 0 });
      const { capture, upload } = await sendJson<{ capture: { id: string }; upload: PresignedUpload }>("/api/captures", "POST", parsed.data);
      await postWithProgress(upload, file, (percent) => setPhase({ kind: "uploading", percent }), xhrRef);
      setPhase({ kind: "finishing" });
      await sendJson(`/api/captures/${capture.id}/uploaded`, "POST");
      router.push(`/captures/${capture.id}/setup`);
    } catch (err) {
      setPhase({ kind: "idle" });
      if (err instanceof DOMException && err.name === "AbortError") return setMessage("Upload cancelled. Nothing was analysed.");
      if (err instanceof FetchError && err.fieldErrors) setErrors(err.fieldErrors);
      setMessage(err instanceof Error ? err.message : "The upload failed.");
    }
  }

  const busy = phase.kind !== "idle";
  return (
    <form onSubmit={submit} className="panel space-y-4" noValidate data-testid="upload-form">
      <div>
        <label htmlFor="cap-site" className="field-label">Site</label>
        <select id="cap-site" className="field-input" value={siteId} onChange={(e) => setSiteId(e.target.value)} disabled={busy}>
          {sites.map((s) => <option key={s.id} value={s.id}>{s.name}</option>)}
        </select>
        {errors.siteId?.map((m) => <p key={m} className="field-error">{m}</p>)}
      </div>
      <fieldset>
        <legend className="field-label">The file holds</legend>
        <div className="mt-1 flex flex-wrap gap-4 text-sm">
          <label className="flex items-center gap-2">
            <input type="radio" name="kind" value="waveform" checked={kind === "waveform"} onChange={() => setKind("waveform")} disabled={busy} />
            Waveform samples (scope or analyser record)
          </label>
          <label className="flex items-center gap-2">
            <input type="radio" name="kind" value="interval-log" checked={kind === "interval-log"} onChange={() => setKind("interval-log")} disabled={busy} data-testid="kind-interval-log" />
            Interval values (logger export: timestamp + per-order values)
          </label>
        </div>
      </fieldset>
      <div
        onDragOver={(e) => {
          e.preventDefault();
          setDragging(true);
        }}
        onDragLeave={() => setDragging(false)}
        onDrop={(e) => {
          e.preventDefault();
          setDragging(false);
          choose(e.dataTransfer.files[0]);
        }}
        className={`rounded-lg border-2 border-dashed p-6 text-center text-sm ${dragging ? "border-copper bg-copper-light" : "border-line bg-paper"}`}
      >
        <p className="font-medium">{file ? `${file.name} · ${(file.size / 1024 / 1024).toFixed(2)} MB` : "Drop the CSV export here"}</p>
        <p className="mt-1 text-ink-muted">CSV or TXT from a scope or power analyser, up to {maxMb} MB. The original is stored unchanged.</p>
        <label className="btn-quiet mt-3 cursor-pointer">
          Choose file
          <input type="file" accept=".csv,.txt,text/csv,text/plain" className="sr-only" data-testid="file-input" onChange={(e) => choose(e.target.files?.[0])} disabled={busy} />
        </label>
        {(errors.filename ?? errors.sizeBytes)?.map((m) => <p key={m} className="field-error">{m}</p>)}
      </div>
      <div>
        <label htmlFor="cap-title" className="field-label">Title</label>
        <input id="cap-title" className="field-input" value={title} onChange={(e) => setTitle(e.target.value)} disabled={busy} placeholder="e.g. Drive 2 at full load, after filter" />
        {errors.title?.map((m) => <p key={m} className="field-error">{m}</p>)}
      </div>
      {phase.kind === "uploading" && (
        <div>
          <div className="h-2 overflow-hidden rounded bg-paper-sunk" role="progressbar" aria-valuenow={phase.percent} aria-valuemin={0} aria-valuemax={100}>
            <div className="h-full bg-copper transition-all" style={{ width: `${phase.percent}%` }} />
          </div>
          <p className="mt-1 text-xs text-ink-muted" data-testid="upload-progress">Uploading… {phase.percent} %</p>
        </div>
      )}
      {phase.kind === "finishing" && <p className="text-sm text-ink-muted">Checking the upload…</p>}
      {message && <p className="rounded bg-fail-light px-3 py-2 text-sm text-fail" role="alert">{message}</p>}
      <div className="flex gap-2">
        <button type="submit" className="btn-primary" disabled={busy}>Upload</button>
        {phase.kind === "uploading" && (
          <button type="button" className="btn-quiet" onClick={() => xhrRef.current?.abort()}>Cancel upload</button>
        )}
      </div>
    </form>
  );
}
