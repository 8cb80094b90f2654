import Link from "next/link";
import type { LimitSetSummaryDto } from "@/lib/swr/use-limit-sets";

// Title, key and the links between a set's pages.
export function LimitSetHeader({
  limitSet,
  canWrite,
  current,
}: {
  limitSet: LimitSetSummaryDto;
  canWrite: boolean;
  current: "view" | "edit" | "history" | "old";
}) {
  const base = `/limits/${limitSet.key}`;
  return (
    <div className="space-y-2">
      <p className="text-sm">
        <Link href="/limits" className="text-ink-muted hover:text-copper">Limit tables</Link>
        <span className="text-ink-muted"> / </span>
        <span className="break-all font-mono text-xs">{limitSet.key}</span>
      </p>
      <div className="flex flex-wrap items-start justify-between gap-3">
        <div className="min-w-0">
          <h1 data-testid="limit-set-title" className="break-words">{limitSet.name}</h1>
          <p className="text-sm text-ink-soft">
            {limitSet.standard} · {limitSet.custom ? "custom" : "published"} · revision{" "}
            <span data-testid="current-revision-number">{limitSet.currentRevisionNumber}</span> is current
          </p>
        </div>
        <nav className="flex flex-wrap gap-2" aria-label="Limit set">
          {current !== "view" && <Link href={base} className="btn-quiet">Current</Link>}
          {current !== "history" && <Link href={`${base}/revisions`} className="btn-quiet" data-testid="history-link">History</Link>}
          <a href={`/api/limit-sets/${limitSet.key}/export`} className="btn-quiet" download={`${limitSet.key}.json`} data-testid="export-link">
            Export JSON
          </a>
          {canWrite && current !== "edit" && (
            <Link href={`${base}/edit`} className="btn-primary" data-testid="edit-link">Edit</Link>
          )}
        </nav>
      </div>
    </div>
  );
}
