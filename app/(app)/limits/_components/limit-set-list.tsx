"use client";

import Link from "next/link";
import { useLimitSets, type LimitSetSummaryDto } from "@/lib/swr/use-limit-sets";

export function LimitSetList({ fallback }: { fallback: { limitSets: LimitSetSummaryDto[] } }) {
  const { data, error } = useLimitSets(fallback);
  const sets = data?.limitSets ?? [];
  return (
    <div className="space-y-2">
      {error && <p className="text-sm text-fail">{error.message}</p>}
      <div className="panel overflow-x-auto p-0 sm:p-0">
        <table className="table-base" data-testid="limit-set-list">
          <thead>
            <tr>
              <th>Limit set</th>
              <th className="hidden sm:table-cell">Standard</th>
              <th className="hidden lg:table-cell">Edition</th>
              <th>Rev.</th>
              <th>Kind</th>
            </tr>
          </thead>
          <tbody>
            {sets.map((s) => (
              <tr key={s.key} data-testid={`limit-set-${s.key}`}>
                <td>
                  <Link href={`/limits/${s.key}`} className="font-medium text-ink hover:text-copper">
                    {s.name}
                  </Link>
                  <div className="break-all font-mono text-xs text-ink-muted">{s.key}</div>
                  <div className="text-xs text-ink-muted sm:hidden">{s.standard}</div>
                </td>
                <td className="hidden sm:table-cell">{s.standard}</td>
                <td className="hidden text-ink-soft lg:table-cell">{s.edition}</td>
                <td className="tabular-nums" data-testid="current-revision">{s.currentRevisionNumber ?? "—"}</td>
                <td>
                  {s.custom ? (
                    <span className="rounded bg-copper-light px-1.5 py-0.5 text-xs text-copper-dark">custom</span>
                  ) : (
                    <span className="rounded bg-idle-light px-1.5 py-0.5 text-xs text-idle">published</span>
                  )}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </div>
  );
}
