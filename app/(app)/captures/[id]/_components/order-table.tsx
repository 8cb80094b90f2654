"use client";

import { useMemo, useState } from "react";
import { VerdictBadge } from "@/app/_components/verdict-badge";
import type { ComplianceRow } from "@/lib/compliance/result";
import { formatMargin, formatNumber, formatPercent } from "@/lib/reports/format";

type SortKey = "order" | "measured" | "limit" | "percentOfLimit" | "margin" | "verdict";
const columns: Array<{ key: SortKey | null; label: string; numeric?: boolean }> = [
  { key: "order", label: "Order" },
  { key: "measured", label: "Measured", numeric: true },
  { key: "limit", label: "Limit", numeric: true },
  { key: null, label: "Unit" },
  { key: "percentOfLimit", label: "% of limit", numeric: true },
  { key: "margin", label: "Margin", numeric: true },
  { key: "verdict", label: "Verdict" },
];
// Worst first when sorting by verdict ascending.
const verdictRank: Record<string, number> = { fail: 0, "not-evaluated": 1, pass: 2, "below-threshold": 3 };

function compare(a: ComplianceRow, b: ComplianceRow, key: SortKey): number {
  if (key === "verdict") return (verdictRank[a.verdict] ?? 9) - (verdictRank[b.verdict] ?? 9) || a.order - b.order;
  const x = a[key];
  const y = b[key];
  // Missing values sort last in either direction (handled by the caller's direction flip).
  if (x === null && y === null) return a.order - b.order;
  if (x === null) return Number.POSITIVE_INFINITY;
  if (y === null) return Number.NEGATIVE_INFINITY;
  return x - y || a.order - b.order;
}

/** The per-order table of one channel: sortable by column, failing orders first on request, hideable non-evaluated rows. */
export function OrderTable({ rows, channelName }: { rows: ComplianceRow[]; channelName: string }) {
  const [sort, setSort] = useState<{ key: SortKey; dir: 1 | -1 }>({ key: "order", dir: 1 });
  const [failingFirst, setFailingFirst] = useState(false);
  const [evaluatedOnly, setEvaluatedOnly] = useState(false);
  const failing = rows.filter((r) => r.verdict === "fail").length;

  const shown = useMemo(() => {
    const list = evaluatedOnly ? rows.filter((r) => r.verdict === "pass" || r.verdict === "fail") : [...rows];
    list.sort((a, b) => {
      if (failingFirst && (a.verdict === "fail") !== (b.verdict === "fail")) return a.verdict === "fail" ? -1 : 1;
      const c = compare(a, b, sort.key);
      if (!Number.isFinite(c)) return c > 0 ? 1 : -1; // nulls last regardless of direction
      return c * sort.dir;
    });
    return list;
  }, [rows, sort, failingFirst, evaluatedOnly]);

  const toggle = (key: SortKey) => setSort((s) => (s.key === key ? { key, dir: s.dir === 1 ? -1 : 1 } : { key, dir: key === "percentOfLimit" ? -1 : 1 }));

  return (
    <div>
      <div className="flex flex-wrap items-center gap-x-5 gap-y-2 border-b border-line px-4 py-3">
        <h2 id="orders-heading" className="mr-auto">
          Per-order sheet · {channelName}{" "}
          <span className="text-sm font-normal text-ink-soft" data-testid="failing-count">
            {failing === 0 ? "no order over its limit" : `${failing} order${failing === 1 ? "" : "s"} over the limit`}
          </span>
        </h2>
        <label className="flex items-center gap-2 text-sm">
          <input type="checkbox" checked={failingFirst} onChange={(e) => setFailingFirst(e.target.checked)} data-testid="failing-first" className="h-4 w-4 accent-copper" />
          Failing orders first
        </label>
        <label className="flex items-center gap-2 text-sm">
          <input type="checkbox" checked={evaluatedOnly} onChange={(e) => setEvaluatedOnly(e.target.checked)} data-testid="evaluated-only" className="h-4 w-4 accent-copper" />
          Only pass / fail rows
        </label>
      </div>
      <div className="overflow-x-auto">
        <table className="table-base min-w-[40rem]" data-testid="order-table">
          <thead>
            <tr>
              {columns.map((c) => (
                <th
                  key={c.label}
                  className={c.numeric ? "text-right" : undefined}
                  aria-sort={c.key && sort.key === c.key ? (sort.dir === 1 ? "ascending" : "descending") : undefined}
                >
                  {c.key ? (
                    <button type="button" onClick={() => toggle(c.key!)} className={`inline-flex items-center gap-1 uppercase hover:text-ink ${c.numeric ? "flex-row-reverse" : ""}`} data-testid={`sort-${c.key}`}>
                      {c.label}
                      <span aria-hidden className="text-ink-muted">{sort.key === c.key ? (sort.dir === 1 ? "▲" : "▼") : "↕"}</span>
                    </button>
                  ) : (
                    c.label
                  )}
                </th>
              ))}
            </tr>
          </thead>
          <tbody className="tabular-nums">
            {shown.map((r) => (
              <tr key={r.order} data-testid={`order-row-${r.order}`} data-verdict={r.verdict} className={r.verdict === "fail" ? "bg-fail-light/60" : undefined}>
                <td className="font-semibold">h{r.order}</td>
                <td className="text-right">{formatNumber(r.measured)}</td>
                <td className="text-right">{formatNumber(r.limit)}</td>
                <td className="text-ink-soft">{r.unit}</td>
                <td className={`text-right ${r.percentOfLimit !== null && r.percentOfLimit > 100 ? "font-semibold text-fail" : ""}`}>{formatPercent(r.percentOfLimit)}</td>
                <td className="text-right">{formatMargin(r.margin)}</td>
                <td>
                  <VerdictBadge verdict={r.verdict} />
                  {r.reason && r.verdict !== "pass" && (
                    <details className="mt-1 max-w-xs text-xs text-ink-soft">
                      <summary className="cursor-pointer select-none text-ink-muted">why</summary>
                      <span data-testid={`reason-${r.order}`}>{r.reason}</span>
                    </details>
                  )}
                </td>
              </tr>
            ))}
            {shown.length === 0 && (
              <tr>
                <td colSpan={7} className="py-6 text-center text-ink-muted">No rows to show with these filters.</td>
              </tr>
            )}
          </tbody>
        </table>
      </div>
    </div>
  );
}
