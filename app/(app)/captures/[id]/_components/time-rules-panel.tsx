import { VerdictBadge } from "@/app/_components/verdict-badge";
import type { TimeBasis } from "@/lib/compliance/result";
import { sentenceStart } from "@/lib/reports/format";
import { describeTimeBasis, formatMultiplier, type TimeRuleLine } from "@/lib/reports/time-rules";

/**
 * The revision's time rules for one channel (what each measures, whether it was applied and why
 * not) and the record they were evaluated on. Shown above the per-order table.
 */
export function TimeRulesPanel({ rules, basis, channelName }: { rules: TimeRuleLine[]; basis?: TimeBasis; channelName: string }) {
  if (rules.length === 0) return null;
  return (
    <section className="panel space-y-3 text-sm" aria-labelledby="time-rules-heading" data-testid="time-rules">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h2 id="time-rules-heading">Time rules · {channelName}</h2>
        <span className="text-xs text-ink-muted">Each order is judged by every rule below; the worst decides its verdict.</span>
      </div>
      {basis && (
        <dl className="grid gap-x-6 gap-y-1 sm:grid-cols-2" data-testid="time-basis" data-coverage={basis.coverage}>
          {describeTimeBasis(basis).map(([k, v]) => (
            <div key={k} className={k === "Coverage" ? "sm:col-span-2" : undefined}>
              <dt className="inline text-ink-muted">{k}: </dt>
              <dd className="inline">{v}</dd>
            </div>
          ))}
        </dl>
      )}
      <ul className="divide-y divide-line border-y border-line">
        {rules.map((rule) => (
          <li key={rule.rule} className="py-2" data-testid={`time-rule-${rule.rule}`} data-status={rule.status}>
            <div className="flex flex-wrap items-start justify-between gap-2">
              <span className="min-w-0 font-medium">{rule.label}</span>
              {rule.status === "applied" ? (
                <span className="inline-flex items-center gap-1.5" data-testid="time-rule-status">
                  <span className="text-xs text-ink-soft">applied</span>
                  <VerdictBadge verdict={rule.failures > 0 ? "fail" : "pass"} />
                </span>
              ) : (
                <span data-testid="time-rule-status"><VerdictBadge verdict="not-evaluated" /></span>
              )}
            </div>
            <p className="text-ink-soft">
              {/* A result stored before rules said what they measure has only the rule's label (above); its id is never shown. */}
              {rule.statistic ? `${sentenceStart(rule.statistic)} · ` : ""}
              limit {formatMultiplier(rule.multiplier)}
              {rule.interval && <> · values: {rule.interval}</>}
              {rule.period && <> · accumulated over: {rule.period}</>}
            </p>
            {rule.status === "applied" ? (
              <p className="text-xs text-ink-muted">
                {rule.valueCount} value{rule.valueCount === 1 ? "" : "s"} per order
                {rule.periodCount > 0 ? ` in ${rule.periodCount} period${rule.periodCount === 1 ? "" : "s"}` : ""}
                {" · "}
                {rule.failures === 0 ? "no order or aggregate over this rule's limit" : `${rule.failures} over this rule's limit`}
                {rule.note ? ` · ${rule.note}` : ""}
              </p>
            ) : (
              <p className="text-xs text-caution" data-testid="time-rule-reason">Not evaluated: {rule.note ?? "no reason given"}</p>
            )}
          </li>
        ))}
      </ul>
    </section>
  );
}
