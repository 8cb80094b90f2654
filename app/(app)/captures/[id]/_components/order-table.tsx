"use client";

import { Fragment, useMemo, useState } from "react";
import { VerdictBadge } from "@/app/_components/verdict-badge";
import type { ComplianceRow } from "@/lib/compliance/result";
import { formatMargin, formatNumber } from "@/lib/reports/format";
import { ruleStatisticText } from "@/lib/reports/result-wording";
import { decidedByLabel, formatPercentOfLimit, formatRuleLimit, formatRulePercentOfLimit, tableLimitIfDifferent } from "@/lib/reports/time-rules";

type SortKey = "order" | "measured" | "limit" | "percentOfLimit" | "margin" | "verdict";
type Column = { key: SortKey | null; label: string; numeric?: boolean; rules?: boolean };
const allColumns: Column[] = [
  { key: "order", label: "Order" },
  { key: "measured", label: "Measured", numeric: true },
  { key: "limit", label: "Limit", numeric: true },
  { key: null, label: "Unit" },
  { key: "percentOfLimit", label: "% of limit", numeric: true },
  { key: "margin", label: "Margin", numeric: true },
  { key: "verdict", label: "Verdict" },
  { key: null, label: "Decided by", rules: true },
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

/**
 * The per-order table of one channel: sortable by column, failing orders first on request, hideable
 * non-evaluated rows. With time rules, each row names the rule that decided it, shows the table limit
 * beside a multiplied one, and opens to every rule's result for that order.
 */
export function OrderTable({ rows, channelName }: { rows: ComplianceRow[]; channelName: string }) {
  const [sort, setSort] = useState<{ key: SortKey; dir: 1 | -1 }>({ key: "order", dir: 1 });
  const [open, setOpen] = useState<Set<number>>(() => new Set());
  const hasRules = rows.some((r) => r.rowRules && r.rowRules.length > 0);
  const columns = hasRules ? allColumns : allColumns.filter((c) => !c.rules);
  const toggleOpen = (order: number) =>
    setOpen((current) => {
      const next = new Set(current);
      if (next.has(order)) next.delete(order);
      else next.add(order);
      return next;
    });
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
        <table className={`table-base ${hasRules ? "min-w-[46rem]" : "min-w-[40rem]"}`} data-testid="order-table">
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
            {shown.map((r) => {
              const tableLimit = tableLimitIfDifferent(r);
              const expanded = open.has(r.order);
              return (
                <Fragment key={r.order}>
                  <tr data-testid={`order-row-${r.order}`} data-verdict={r.verdict} data-decided-by={r.decidedBy} className={r.verdict === "fail" ? "bg-fail-light/60" : undefined}>
                    <td className="font-semibold">h{r.order}</td>
                    <td className="text-right">{formatNumber(r.measured)}</td>
                    <td className="text-right">
                      {formatNumber(r.limit)}
                      {tableLimit !== null && (
                        <span className="block text-xs text-ink-muted" data-testid={`table-limit-${r.order}`}>
                          table {formatNumber(tableLimit)}
                        </span>
                      )}
                    </td>
                    <td className="text-ink-soft">{r.unit}</td>
                    <td className={`min-w-[5.5rem] text-right ${r.percentOfLimit !== null && r.percentOfLimit > 100 ? "font-semibold text-fail" : ""}`}>{formatPercentOfLimit(r)}</td>
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
                    {hasRules && (
                      <td className="whitespace-nowrap">
                        <span className="block text-ink-soft" data-testid={`decided-by-${r.order}`}>{decidedByLabel(r) || "—"}</span>
                        {r.rowRules && r.rowRules.length > 0 && (
                          <button
                            type="button"
                            onClick={() => toggleOpen(r.order)}
                            aria-expanded={expanded}
                            aria-controls={`rules-${channelName}-${r.order}`}
                            className="mt-0.5 inline-flex items-center gap-1 text-xs text-ink-muted hover:text-copper"
                            data-testid={`rules-toggle-${r.order}`}
                          >
                            <span aria-hidden>{expanded ? "▾" : "▸"}</span>
                            {expanded ? "hide" : "all"} {r.rowRules.length} rule{r.rowRules.length === 1 ? "" : "s"}
                          </button>
                        )}
                      </td>
                    )}
                  </tr>
                  {hasRules && expanded && r.rowRules && (
                    <tr id={`rules-${channelName}-${r.order}`} className="bg-paper-sunk/60" data-testid={`rules-detail-${r.order}`}>
                      <td colSpan={columns.length} className="py-2">
                        {/* Sticky so the details stay in view when the table is scrolled sideways on a phone. */}
                        <div className="sticky left-3 max-w-[calc(100vw-3.5rem)]">
                          <RuleResults row={r} />
                        </div>
                      </td>
                    </tr>
                  )}
                </Fragment>
              );
            })}
            {shown.length === 0 && (
              <tr>
                <td colSpan={columns.length} className="py-6 text-center text-ink-muted">No rows to show with these filters.</td>
              </tr>
            )}
          </tbody>
        </table>
      </div>
    </div>
  );
}

/** Every rule's judgement of one order: statistic, limit × multiplier, % of limit, verdict and reason. */
function RuleResults({ row }: { row: ComplianceRow }) {
  return (
    <div className="space-y-1.5 text-xs">
      <p className="text-ink-muted">
        Rules for h{row.order}
        {row.decidedBy ? ` — decided by ${decidedByLabel(row)}` : ""}. Limits in {row.unit}; a multiplied limit shows the table limit in brackets.
      </p>
      <ul className="space-y-1.5">
        {(row.rowRules ?? []).map((result) => (
          <li
            key={result.rule}
            className={`rounded border px-2 py-1.5 ${result.rule === row.decidedBy ? "border-copper/60 bg-paper-raised" : "border-line bg-paper-raised/70"}`}
            data-testid={`rule-result-${result.rule}`}
            data-verdict={result.verdict}
          >
            <div className="flex flex-wrap items-center gap-x-3 gap-y-1">
              <VerdictBadge verdict={result.verdict} />
              <span className="font-medium text-ink">{result.label}</span>
              {result.rule === row.decidedBy && <span className="text-copper">decides</span>}
            </div>
            <div className="mt-0.5 grid gap-x-4 text-ink-soft sm:grid-cols-[minmax(0,2fr)_repeat(3,minmax(0,1fr))]">
              <span>{ruleStatisticText(result) || "—"}</span>
              <span>measured {formatNumber(result.measured)} {result.unit}</span>
              <span>limit {formatRuleLimit(result)} {result.unit}</span>
              <span>{formatRulePercentOfLimit(result)}</span>
            </div>
            {result.reason && <p className="mt-0.5 text-ink-muted">{result.reason}</p>}
            {result.valueCount !== undefined && result.valueCount > 0 && (
              <p className="text-ink-muted">
                over {result.valueCount} value{result.valueCount === 1 ? "" : "s"}
                {result.periodCount ? ` in ${result.periodCount} period${result.periodCount === 1 ? "" : "s"}` : ""}
              </p>
            )}
          </li>
        ))}
      </ul>
    </div>
  );
}
