import { getLimitSetByKey } from "@/db/queries/limit-sets";
import { requirePage } from "@/lib/auth/page";
import { can } from "@/lib/auth/permissions";
import type { LimitSetDetailDto } from "@/lib/swr/use-limit-sets";
import { CloneForm } from "../_components/clone-form";
import { LimitSetView } from "../_components/limit-set-view";
import { loadOr404, toWire } from "../_components/load-limit-set";

export default async function LimitSetPage({ params }: { params: Promise<{ key: string }> }) {
  const user = await requirePage("limits:read");
  const { key } = await params;
  const detail = toWire<LimitSetDetailDto>(await loadOr404(key, (k) => getLimitSetByKey({ key: k })));
  const canWrite = can(user.role, "limits:write");
  return (
    <div className="space-y-6">
      <LimitSetView fallback={detail} canWrite={canWrite} />
      {canWrite && <CloneForm sourceKey={detail.limitSet.key} sourceName={detail.limitSet.name} />}
    </div>
  );
}
