import { VerdictBadge } from "@/app/_components/verdict-badge";
import type { ComplianceAggregate } from "@/lib/compliance/result";
import { formatNumber } from "@/lib/reports/format";
import { decidedByLabel, formatPercentOfLimit, tableLimitIfDifferent } from "@/lib/reports/time-rules";

/** A remark longer than this gets a card two columns wide on a wide screen (a quarter of the row is too narrow to read it). */
const WIDE_REMARK_CHARS = 140;

/** THD, TDD, THC… of one channel, each with measured, limit, % of limit and verdict. */
export function AggregateCards({ aggregates }: { aggregates: ComplianceAggregate[] }) {
  if (aggregates.length === 0) return null;
  return (
    <section aria-label="Aggregates" className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4" data-testid="aggregates">
      {aggregates.map((a) => (
        <div key={a.name} className={`panel min-w-0 ${a.verdict === "fail" ? "border-fail/50" : ""} ${(a.reason?.length ?? 0) > WIDE_REMARK_CHARS ? "sm:col-span-2" : ""}`} data-testid={`aggregate-${a.name}`}>
          <div className="flex items-start justify-between gap-2">
            <h3 className="text-sm font-semibold">
              {a.name}
              {a.role === "allowance-condition" && <span className="ml-1 text-xs font-normal text-ink-muted">(allowance check)</span>}
            </h3>
            <VerdictBadge verdict={a.verdict} />
          </div>
          <p className="mt-2 text-2xl font-semibold tabular-nums">
            {formatNumber(a.measured)} <span className="text-sm font-normal text-ink-muted">{a.unit}</span>
          </p>
          <p className="text-sm text-ink-soft tabular-nums">
            limit {formatNumber(a.limit)} {a.unit} · % of limit: {formatPercentOfLimit(a)}
          </p>
          {a.decidedBy && (
            <p className="mt-1 text-xs text-ink-soft" data-testid={`aggregate-${a.name}-decided-by`}>
              decided by <span className="font-medium">{decidedByLabel(a)}</span>
              {tableLimitIfDifferent(a) !== null && <> · table limit {formatNumber(tableLimitIfDifferent(a))} {a.unit}</>}
            </p>
          )}
          {a.reason && <p className="mt-1 text-xs text-ink-muted">{a.reason}</p>}
        </div>
      ))}
    </section>
  );
}
