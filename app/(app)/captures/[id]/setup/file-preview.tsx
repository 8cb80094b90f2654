import type { ReactNode } from "react";

/**
 * The "File preview" panel of a set-up form: the file's first lines as stored, the problem the
 * preview found (if any), and what the form adds below them (e.g. the detected layout).
 */
export function FilePreview({ data, error, children }: { data: { firstLines: string[]; problem: string | null } | undefined; error: Error | undefined; children?: ReactNode }) {
  return (
    <section className="panel space-y-2">
      <h2>File preview</h2>
      {error && <p className="text-sm text-fail">{error.message}</p>}
      {!data && !error && <p className="text-sm text-ink-muted">Reading the first lines…</p>}
      {data && (
        <pre className="max-h-48 overflow-auto rounded bg-paper-sunk p-2 font-mono text-2xs leading-4" data-testid="preview-lines">
          {data.firstLines.join("\n")}
        </pre>
      )}
      {data?.problem && <p className="rounded bg-fail-light px-3 py-2 text-sm text-fail" role="alert">{data.problem}</p>}
      {children}
    </section>
  );
}
