import { listRevisionsByKey } from "@/db/queries/limit-sets";
import { requirePage } from "@/lib/auth/page";
import { can } from "@/lib/auth/permissions";
import type { LimitSetSummaryDto, RevisionHistoryEntryDto } from "@/lib/swr/use-limit-sets";
import { loadOr404, toWire } from "../../_components/load-limit-set";
import { RevisionHistory } from "../../_components/revision-history";

export default async function LimitSetRevisionsPage({ params }: { params: Promise<{ key: string }> }) {
  const user = await requirePage("limits:read");
  const { key } = await params;
  const history = toWire<{ limitSet: LimitSetSummaryDto; revisions: RevisionHistoryEntryDto[] }>(
    await loadOr404(key, (k) => listRevisionsByKey({ key: k })),
  );
  return <RevisionHistory fallback={history} canWrite={can(user.role, "limits:write")} />;
}
