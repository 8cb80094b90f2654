"use client";

import Link from "next/link";
import type { RevisionChange } from "@/lib/compliance/diff-revisions";
import { useLimitSetRevisions, type LimitSetSummaryDto, type RevisionHistoryEntryDto } from "@/lib/swr/use-limit-sets";
import { LimitSetHeader } from "./limit-set-header";
import { formatWhen } from "./format-when";

const kindStyle: Record<RevisionChange["kind"], string> = {
  changed: "bg-caution-light text-caution",
  added: "bg-pass-light text-pass",
  removed: "bg-fail-light text-fail",
};

function ChangeValue({ value, struck }: { value: string | undefined; struck?: boolean }) {
  if (value === undefined) return <span className="text-ink-muted">—</span>;
  // Whole rows arrive as JSON; keep them from stretching a phone screen.
  return <code className={`break-all font-mono text-xs ${struck ? "text-ink-muted line-through" : ""}`}>{value}</code>;
}

function Changes({ changes, number }: { changes: RevisionChange[]; number: number }) {
  if (changes.length === 0) return <p className="text-sm text-ink-muted">No cell changed.</p>;
  return (
    <ul className="divide-y divide-line/60 text-sm" data-testid={`changes-${number}`}>
      {changes.map((c, i) => (
        <li key={i} className="grid gap-1 py-2 sm:grid-cols-[minmax(0,2fr)_minmax(0,3fr)] sm:gap-3" data-testid="change">
          <div className="min-w-0">
            <span className={`mr-2 rounded px-1.5 py-0.5 text-2xs uppercase ${kindStyle[c.kind]}`}>{c.kind}</span>
            <span className="font-medium">{c.location}</span>
            {c.field && <span className="text-ink-soft">: {c.field}</span>}
          </div>
          <div className="min-w-0">
            <ChangeValue value={c.before} struck={c.kind !== "added"} /> <span aria-label="becomes">→</span> <ChangeValue value={c.after} />
          </div>
        </li>
      ))}
    </ul>
  );
}

export function RevisionHistory({
  fallback,
  canWrite,
}: {
  fallback: { limitSet: LimitSetSummaryDto; revisions: RevisionHistoryEntryDto[] };
  canWrite: boolean;
}) {
  const { data } = useLimitSetRevisions(fallback.limitSet.key, fallback);
  const { limitSet, revisions } = data ?? fallback;
  return (
    <div className="space-y-4">
      <LimitSetHeader limitSet={limitSet} canWrite={canWrite} current="history" />
      <h2>History</h2>
      <ol className="space-y-3" data-testid="revision-list">
        {revisions.map((r) => (
          <li key={r.number} className="panel space-y-2" data-testid={`revision-${r.number}`}>
            <div className="flex flex-wrap items-baseline justify-between gap-2">
              <p>
                <Link href={`/limits/${limitSet.key}/revisions/${r.number}`} className="font-semibold hover:text-copper">
                  Revision {r.number}
                </Link>
                {r.current && <span className="ml-2 rounded bg-pass-light px-1.5 py-0.5 text-xs text-pass">current</span>}
              </p>
              <p className="text-xs text-ink-muted">
                {formatWhen(r.createdAt)}
                {r.authorName ? ` · ${r.authorName}` : ""}
              </p>
            </div>
            <p className="text-sm" data-testid="revision-reason">“{r.reason}”</p>
            {r.number > 1 && <Changes changes={r.changes} number={r.number} />}
          </li>
        ))}
      </ol>
    </div>
  );
}
