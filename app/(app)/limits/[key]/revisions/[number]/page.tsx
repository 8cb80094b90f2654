import Link from "next/link";
import { getRevisionByKeyAndNumber } from "@/db/queries/limit-sets";
import { listRevisionVerifications } from "@/db/queries/limit-verifications";
import { requirePage } from "@/lib/auth/page";
import { can } from "@/lib/auth/permissions";
import type { LimitSetSummaryDto } from "@/lib/swr/use-limit-sets";
import { LimitSetHeader } from "../../../_components/limit-set-header";
import { loadOr404, revisionNumberOr404, toWire } from "../../../_components/load-limit-set";
import { RevisionTable } from "../../../_components/revision-table";
import { VerificationPanel } from "../../../_components/verification-panel";
import { formatWhen } from "../../../_components/format-when";

// An old (or the current) revision, read-only: revisions never change once saved.
export default async function LimitSetRevisionPage({ params }: { params: Promise<{ key: string; number: string }> }) {
  const user = await requirePage("limits:read");
  const { key, number } = await params;
  const n = revisionNumberOr404(number);
  const { limitSet, revision } = await loadOr404(key, (k) => getRevisionByKeyAndNumber({ key: k, number: n }));
  const isCurrent = revision.number === limitSet.currentRevisionNumber;
  const verifications = await listRevisionVerifications({ key: limitSet.key, number: revision.number });
  return (
    <div className="space-y-4">
      <LimitSetHeader limitSet={toWire<LimitSetSummaryDto>(limitSet)} canWrite={can(user.role, "limits:write")} current="old" />
      <p className={`rounded px-3 py-2 text-sm ${isCurrent ? "bg-pass-light" : "bg-caution-light"}`} data-testid="revision-banner">
        Revision <span data-testid="revision-number">{revision.number}</span> · {formatWhen(revision.createdAt)}
        {revision.authorName ? ` · ${revision.authorName}` : ""} · “{revision.reason}” —{" "}
        {isCurrent ? (
          "this is the current revision."
        ) : (
          <>
            read-only; revision {limitSet.currentRevisionNumber} is current.{" "}
            <Link href={`/limits/${limitSet.key}/revisions`} className="underline">See what changed</Link>
          </>
        )}
      </p>
      <VerificationPanel
        limitSetKey={limitSet.key}
        revisionNumber={revision.number}
        verifications={verifications.map(({ createdAt: _c, ...v }) => v)}
        canVerify={can(user.role, "limits:write")}
        today={new Date().toISOString().slice(0, 10)}
      />
      <RevisionTable content={revision.content} />
    </div>
  );
}
