// Time-rule wording shared by the sheet, the share page, the PDF and the CSV: which rule decided a
// verdict, what each rule measures, and what the rules were evaluated on.
import type { ComplianceAggregate, ComplianceRow, RowRuleResult, TimeBasis, TimeRuleSummary } from "@/lib/compliance/result";
import { formatNumber, formatPercent } from "./format";
import { accumulationText, formatDurationS, formatMultiplier, formatUtc, intervalText, shortRuleLabel, statisticText, timeRuleSummaryNote } from "./result-wording";

/** A rule of the revision as the time-rules panel lists it. */
export interface TimeRuleLine extends Omit<TimeRuleSummary, "accumulation" | "reason"> {
  /** What the rule takes, e.g. "99th percentile (nearest rank) of 3 s values per 24 h period (worst period)"; "" when unknown. */
  statistic: string;
  /** The values the statistic is taken over, e.g. "1.5 s smoothed", "3 s", "10 min"; null when unknown. */
  interval: string | null;
  /** Accumulation period, e.g. "24 h", or "whole record"; null when unknown. */
  period: string | null;
  /** Why the rule was not evaluated, or how its periods covered the record. */
  note?: string;
}

/**
 * The channel's time rules with what each one measures, for the panel and the PDF — from the
 * summary's typed fields, else (results stored before them) from the first row result that
 * carries them; the statistic text stored with older results is shown as it is. Empty when the
 * revision has no time rules.
 *
 * @example timeRuleLines(channel.timeRules, channel.rows, channel.aggregates)[0].interval // "1.5 s smoothed"
 */
export function timeRuleLines(summaries: TimeRuleSummary[] | undefined, rows: ComplianceRow[], aggregates: ComplianceAggregate[] = []): TimeRuleLine[] {
  if (!summaries) return [];
  const results = [...rows, ...aggregates].flatMap((r) => r.rowRules ?? []);
  return summaries.map(({ accumulation: _periods, reason: _reason, ...summary }) => {
    const first = results.find((r) => r.rule === summary.rule && (r.measures || r.statistic));
    const measures = summary.measures ?? first?.measures;
    const statistic = measures ? statisticText(measures) : (first?.statistic ?? "");
    const note = timeRuleSummaryNote({ status: summary.status, cause: summary.cause, accumulation: _periods, measures: summary.measures, reason: _reason });
    return {
      ...summary,
      statistic,
      interval: measures ? intervalText(measures) : null,
      period: measures ? accumulationText(measures) : null,
      ...(note ? { note } : {}),
    };
  });
}

export { formatMultiplier, shortRuleLabel };

/** The result of the rule that decided a row or aggregate, when it decided by a rule. */
export function decidingRule(row: Pick<ComplianceRow, "decidedBy" | "rowRules">): RowRuleResult | undefined {
  if (!row.decidedBy || row.decidedBy === "threshold") return undefined;
  return row.rowRules?.find((r) => r.rule === row.decidedBy);
}

/** "decided by" text of a row: the short rule name, or "" when the revision has no time rules. */
export function decidedByLabel(row: Pick<ComplianceRow, "decidedBy" | "rowRules">): string {
  if (!row.decidedBy) return "";
  return shortRuleLabel(decidingRule(row), row.decidedBy);
}

/**
 * The table limit of a row (before a rule's multiplier or an allowance), or null when it equals the
 * applied limit or is unknown — the sheet shows it only where the two differ.
 */
export function tableLimitIfDifferent(row: Pick<ComplianceRow, "limit" | "decidedBy" | "rowRules">): number | null {
  const decider = decidingRule(row);
  const table = decider?.tableLimit ?? null;
  if (table === null || row.limit === null) return null;
  return Math.abs(table - row.limit) <= 1e-9 * Math.max(Math.abs(table), Math.abs(row.limit)) ? null : table;
}

/** The table limit of a row: the deciding rule's, else the applied limit (capture-mean rows use the table limit as is). */
export function tableLimitOf(row: Pick<ComplianceRow, "limit" | "decidedBy" | "rowRules">): number | null {
  return decidingRule(row)?.tableLimit ?? row.limit;
}

const COVERAGE: Record<TimeBasis["coverage"], string> = {
  all: "every time rule applied",
  partial: "some time rules applied",
  none: "no time rule applied",
};

/**
 * What the time rules were evaluated on, as label/value pairs:
 * [["Record", "0.4 s of 10/12-cycle windows"], ["Values", "2 × 0.2 s"], ["Coverage", "…"]].
 */
export function describeTimeBasis(basis: TimeBasis): Array<[string, string]> {
  const source = basis.source === "windows" ? "10/12-cycle analysis windows" : basis.source === "interval-log" ? "interval log" : "no per-value series";
  const out: Array<[string, string]> = [["Record", `${formatDurationS(basis.durationS)} of ${source}`]];
  out.push(["Values", basis.valueS !== null ? `${basis.valueCount} × ${formatDurationS(basis.valueS)}` : String(basis.valueCount)]);
  if (basis.startMs !== null) out.push(["Starts", formatUtc(basis.startMs)]);
  const fallback = basis.snapshotFallback
    ? "; where a rule cannot be evaluated the capture r.m.s. mean is compared with 1.0 × the limit"
    : "; a rule that cannot be evaluated leaves its rows not evaluated";
  out.push(["Coverage", `${COVERAGE[basis.coverage]}${fallback}`]);
  return out;
}

/** A rule result's limit as "0.918 (0.612 ×1.5)", or just the limit when the multiplier is 1. */
export function formatRuleLimit(result: Pick<RowRuleResult, "limit" | "tableLimit" | "multiplier">): string {
  if (result.limit === null) return "—";
  if (result.tableLimit === null) return formatNumber(result.limit);
  const scaled = result.tableLimit * result.multiplier;
  const plain = Math.abs(result.limit - scaled) <= 1e-9 * Math.max(Math.abs(scaled), 1e-12);
  if (plain && result.multiplier === 1) return formatNumber(result.limit);
  // An allowance (POHC, 200 % relaxation) raised the limit beyond table × multiplier.
  return plain
    ? `${formatNumber(result.limit)} (${formatNumber(result.tableLimit)} ${formatMultiplier(result.multiplier)})`
    : `${formatNumber(result.limit)} (${formatNumber(result.tableLimit)} with an allowance)`;
}

/**
 * A row's or aggregate's measured value as a percentage of its TABLE limit (before a time rule's
 * multiplier or an allowance); null where either is unknown.
 *
 * @example percentOfTableLimit(h7) // 82.7 — 0.637 A of the 0.77 A table limit, judged against 1.5 × 0.77 A
 */
export function percentOfTableLimit(row: Pick<ComplianceRow, "measured" | "limit" | "decidedBy" | "rowRules">): number | null {
  const table = tableLimitOf(row);
  if (row.measured === null || table === null || !(table > 0)) return null;
  return (row.measured / table) * 100;
}

function overByText(over: number): string {
  // Enough digits to show the excess that decided the verdict (an at-the-limit fail reads "100.0 %" otherwise).
  return `over the limit by ${Number(over.toPrecision(2))} %`;
}

/**
 * Decimals enough for a percentage to read on the side of the allowed percentage its verdict says: a
 * failing row above it, a passing row just under it below it (99.96 %, not "100.0 %").
 */
function decimalsToShowExcess(pct: number, allowedPct: number, fails: boolean): number {
  let digits = 1;
  const hidden = (d: number) => (fails ? Number(pct.toFixed(d)) <= Number(allowedPct.toFixed(d)) : pct < allowedPct && Number(pct.toFixed(d)) >= Number(allowedPct.toFixed(d)));
  while (digits < 8 && hidden(digits)) digits += 1;
  return digits;
}

/**
 * "% of limit" as a reader sees it: against the table limit, with the rule's allowance beside it
 * where a time rule's multiplier or an allowance applied ("153.9 % of the table limit — rule
 * allows 150 %"), and — where one decimal would hide why a row failed — the excess in words
 * ("100.0 % — over the limit by 0.0022 %"). `compact` (narrow PDF cells): the percentage alone,
 * with as many decimals as it takes to read above the allowed value ("100.0022 %"); the rule's
 * multiplier is then in the "decided by" column; `standalone` (order cards, rule lines): an
 * unscaled percentage reads "87.7 % of the limit". "—" when unknown. The order table, the phone
 * order cards, the aggregate cards and the PDF all call this one function.
 */
export function formatPercentOfLimit(
  row: Pick<ComplianceRow, "measured" | "limit" | "percentOfLimit" | "decidedBy" | "rowRules"> & { verdict: string },
  options: { compact?: boolean; standalone?: boolean } = {},
): string {
  const table = tableLimitOf(row);
  const pct = percentOfTableLimit(row);
  // `standalone` (a card or a line of text, no "% of limit" column heading above): "87.7 % of the limit".
  const ofTheLimit = options.standalone ? " of the limit" : "";
  if (pct === null || table === null || row.limit === null || row.measured === null) return `${formatPercent(row.percentOfLimit)}${row.percentOfLimit === null ? "" : ofTheLimit}`;
  const allowedPct = (row.limit / table) * 100;
  const fails = row.verdict === "fail";
  if (options.compact) return `${pct.toFixed(decimalsToShowExcess(pct, allowedPct, fails))} %`;
  const scaled = Math.abs(allowedPct - 100) > 1e-9;
  const digits = fails ? 1 : decimalsToShowExcess(pct, allowedPct, false);
  const shown = `${pct.toFixed(digits)} %${scaled ? ` of the table limit — rule allows ${formatNumber(allowedPct)} %` : ofTheLimit}`;
  if (!fails || decimalsToShowExcess(pct, allowedPct, fails) === 1) return shown;
  const over = (row.measured / row.limit - 1) * 100;
  return `${shown} — ${over > 0 ? overByText(over) : "at the limit, which fails (the rule asks for less than the limit)"}`;
}

/**
 * One rule's result as "% of limit" text, the same way as a row's: against the table limit with the
 * rule's allowance beside it ("153.9 % of the table limit — rule allows 150 %"), never as a
 * percentage of the multiplied limit. Used by the order table's rule list and the phone cards.
 *
 * @example formatRulePercentOfLimit({ rule: "r", measured: 3.54, limit: 3.45, tableLimit: 2.3, multiplier: 1.5, verdict: "fail", … })
 * // "153.9 % of the table limit — rule allows 150 %"
 */
export function formatRulePercentOfLimit(result: RowRuleResult): string {
  return formatPercentOfLimit(
    { measured: result.measured, limit: result.limit, percentOfLimit: result.percentOfLimit, verdict: result.verdict, decidedBy: result.rule, rowRules: [result] },
    { standalone: true },
  );
}
