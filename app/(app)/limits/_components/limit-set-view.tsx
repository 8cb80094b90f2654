"use client";

import { useLimitSet, type LimitSetDetailDto } from "@/lib/swr/use-limit-sets";
import { LimitSetHeader } from "./limit-set-header";
import { RevisionTable } from "./revision-table";
import { formatWhen } from "./format-when";

// The current revision of a set, kept fresh through SWR after edits elsewhere.
export function LimitSetView({ fallback, canWrite }: { fallback: LimitSetDetailDto; canWrite: boolean }) {
  const { data } = useLimitSet(fallback.limitSet.key, fallback);
  const { limitSet, revision } = data ?? fallback;
  return (
    <div className="space-y-4">
      <LimitSetHeader limitSet={limitSet} canWrite={canWrite} current="view" />
      <p className="text-sm text-ink-muted">
        Revision {revision.number} · {formatWhen(revision.createdAt)}
        {revision.authorName ? ` · ${revision.authorName}` : ""} · “{revision.reason}”
      </p>
      <RevisionTable content={revision.content} />
    </div>
  );
}
