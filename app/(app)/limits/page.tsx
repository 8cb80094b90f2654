import { listLimitSets } from "@/db/queries/limit-sets";
import { requirePage } from "@/lib/auth/page";
import { can } from "@/lib/auth/permissions";
import type { LimitSetSummaryDto } from "@/lib/swr/use-limit-sets";
import { ImportForm } from "./_components/import-form";
import { LimitSetList } from "./_components/limit-set-list";

export const metadata = { title: "Limit tables" };

export default async function LimitsPage() {
  const user = await requirePage("limits:read");
  // Dates go to the client island as the API sends them (ISO strings).
  const limitSets = JSON.parse(JSON.stringify(await listLimitSets())) as LimitSetSummaryDto[];
  return (
    <div className="space-y-4">
      <div>
        <h1>Limit tables</h1>
        <p className="text-sm text-ink-soft">
          Published tables are seeded from the standards; custom ones are clones an admin adapted. Every edit is a new revision.
        </p>
      </div>
      <LimitSetList fallback={{ limitSets }} />
      {can(user.role, "limits:write") && <ImportForm />}
    </div>
  );
}
