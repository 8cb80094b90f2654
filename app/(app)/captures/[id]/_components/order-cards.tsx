"use client";

import { useState } from "react";
import { VerdictBadge } from "@/app/_components/verdict-badge";
import type { ComplianceRow } from "@/lib/compliance/result";
import { formatMargin, formatNumber } from "@/lib/reports/format";
import { decidedByLabel, formatPercentOfLimit, formatRuleLimit, formatRulePercentOfLimit, tableLimitIfDifferent } from "@/lib/reports/time-rules";

/**
 * The per-order results on a phone: one card per order with order, measured, limit, % of limit and
 * verdict in view, and the rest (margin, table limit, deciding rule, every rule's result, reason) on tap.
 * No sideways scrolling. Failing orders can be put first; orders that were not judged can be hidden.
 * Values and wording are the order table's (one formatting function each): "% of limit" against the
 * table limit with the rule's allowance beside it, and the excess in words for an at-the-limit fail.
 */
export function OrderCards({ rows, channelName }: { rows: ComplianceRow[]; channelName: string }) {
  const [failingFirst, setFailingFirst] = useState(true);
  const [evaluatedOnly, setEvaluatedOnly] = useState(true);
  // A card's details are rendered once it is opened: 50 cards of rule results are most of a page otherwise.
  const [opened, setOpened] = useState<ReadonlySet<number>>(() => new Set());
  const toggled = (order: number, open: boolean) =>
    setOpened((current) => {
      if (open === current.has(order)) return current;
      const next = new Set(current);
      if (open) next.add(order);
      else next.delete(order);
      return next;
    });
  const list = (evaluatedOnly ? rows.filter((r) => r.verdict === "pass" || r.verdict === "fail") : [...rows]).sort(
    (a, b) => (failingFirst && (a.verdict === "fail") !== (b.verdict === "fail") ? (a.verdict === "fail" ? -1 : 1) : a.order - b.order),
  );
  return (
    <section className="space-y-2" aria-label={`Orders of ${channelName}`} data-testid="order-cards">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <h2>Orders of {channelName}</h2>
        <div className="flex flex-wrap gap-3 text-sm">
          <label className="flex items-center gap-1.5">
            <input type="checkbox" checked={failingFirst} onChange={(e) => setFailingFirst(e.target.checked)} /> failing first
          </label>
          <label className="flex items-center gap-1.5">
            <input type="checkbox" checked={evaluatedOnly} onChange={(e) => setEvaluatedOnly(e.target.checked)} data-testid="order-cards-judged-only" /> judged orders only
          </label>
        </div>
      </div>
      <ul className="space-y-2">
        {list.map((r) => (
          <li key={r.order} data-testid={`order-card-${r.order}`} data-verdict={r.verdict}>
            <details className={`rounded-md border bg-paper-raised ${r.verdict === "fail" ? "border-fail/60" : "border-line"}`} onToggle={(e) => toggled(r.order, e.currentTarget.open)}>
              <summary className="grid cursor-pointer grid-cols-[3rem_minmax(0,1fr)_auto] items-center gap-x-3 gap-y-0.5 px-3 py-2">
                <span className="text-base font-semibold">h{r.order}</span>
                <span className="text-sm tabular-nums">
                  {formatNumber(r.measured)} / {formatNumber(r.limit)} {r.unit}
                  {tableLimitIfDifferent(r) !== null && <span className="text-xs text-ink-muted"> (table {formatNumber(tableLimitIfDifferent(r))})</span>}
                  <span className={`block ${r.percentOfLimit !== null && r.percentOfLimit > 100 ? "font-semibold text-fail" : "text-ink-soft"}`} data-testid={`order-card-percent-${r.order}`}>
                    {formatPercentOfLimit(r, { standalone: true })}
                  </span>
                </span>
                <VerdictBadge verdict={r.verdict} />
              </summary>
              {opened.has(r.order) && (
                <dl className="grid grid-cols-2 gap-x-3 gap-y-1 border-t border-line px-3 py-2 text-sm">
                  <div>
                    <dt className="text-xs text-ink-soft">Measured</dt>
                    <dd className="tabular-nums">{formatNumber(r.measured)} {r.unit}</dd>
                  </div>
                  <div>
                    <dt className="text-xs text-ink-soft">Limit</dt>
                    <dd className="tabular-nums">{formatNumber(r.limit)} {r.unit}</dd>
                  </div>
                  <div>
                    <dt className="text-xs text-ink-soft">Margin</dt>
                    <dd className="tabular-nums">{formatMargin(r.margin)} {r.unit}</dd>
                  </div>
                  {tableLimitIfDifferent(r) !== null && (
                    <div>
                      <dt className="text-xs text-ink-soft">Table limit</dt>
                      <dd className="tabular-nums">{formatNumber(tableLimitIfDifferent(r))} {r.unit}</dd>
                    </div>
                  )}
                  {r.decidedBy && (
                    <div className="col-span-2">
                      <dt className="text-xs text-ink-soft">Decided by</dt>
                      <dd>{decidedByLabel(r)}</dd>
                    </div>
                  )}
                  {(r.rowRules ?? []).map((rule) => (
                    <div key={rule.rule} className="col-span-2 rounded border border-line px-2 py-1 text-xs" data-testid={`order-card-rule-${rule.rule}`}>
                      <span className="font-medium">{rule.label}</span>: measured {formatNumber(rule.measured)} {rule.unit}, limit {formatRuleLimit(rule)} {rule.unit},{" "}
                      {formatRulePercentOfLimit(rule)} — <VerdictBadge verdict={rule.verdict} />
                      {rule.reason && <span className="block text-ink-soft">{rule.reason}</span>}
                    </div>
                  ))}
                  {r.reason && <p className="col-span-2 text-xs text-ink-soft">{r.reason}</p>}
                </dl>
              )}
            </details>
          </li>
        ))}
        {list.length === 0 && <li className="text-sm text-ink-soft">No orders to show with these filters.</li>}
      </ul>
    </section>
  );
}
