import { getLimitSetByKey } from "@/db/queries/limit-sets";
import { requirePage } from "@/lib/auth/page";
import type { LimitSetSummaryDto } from "@/lib/swr/use-limit-sets";
import { LimitSetEditor } from "../../_components/limit-set-editor";
import { LimitSetHeader } from "../../_components/limit-set-header";
import { loadOr404, toWire } from "../../_components/load-limit-set";

export default async function EditLimitSetPage({ params }: { params: Promise<{ key: string }> }) {
  await requirePage("limits:write");
  const { key } = await params;
  const { limitSet, revision } = await loadOr404(key, (k) => getLimitSetByKey({ key: k }));
  return (
    <div className="space-y-4">
      <LimitSetHeader limitSet={toWire<LimitSetSummaryDto>(limitSet)} canWrite current="edit" />
      <LimitSetEditor setKey={limitSet.key} content={revision.content} revisionNumber={revision.number} />
    </div>
  );
}
