import { causeText, powerChoiceRows, thresholdText } from "../reports/result-wording";
import { formatNumber as num } from "./format-number";
import type { ChannelCompliance, ComplianceResult } from "./result";

function pct(x: number | null): string {
  return x === null ? "—" : `${x.toFixed(1)} %`;
}

function table(headers: string[], rows: string[][]): string[] {
  const widths = headers.map((header, i) => Math.max(header.length, ...rows.map((row) => (row[i] ?? "").length)));
  const line = (cells: string[]): string =>
    cells.map((cell, i) => (i === 0 ? cell.padEnd(widths[i] as number) : cell.padStart(widths[i] as number))).join("  ").trimEnd();
  return [line(headers), widths.map((width) => "-".repeat(width)).join("  "), ...rows.map(line)];
}

function channelBlock(channel: ChannelCompliance): string[] {
  const lines = [`channel ${channel.channel}: ${channel.verdict.toUpperCase()}`, `  band: ${channel.band.label ?? "(none)"} — ${channel.band.reason}`];
  if (channel.power) for (const [label, value] of powerChoiceRows(channel.power)) lines.push(`  ${label.toLowerCase()}: ${value}`);
  for (const note of channel.derived.notes) lines.push(`  ${note}`);
  if (channel.rows.length > 0) {
    lines.push(
      ...table(
        ["order", "measured", "limit", "unit", "% of limit", "verdict"],
        channel.rows.map((row) => [String(row.order), num(row.measured), num(row.limit), row.unit, pct(row.percentOfLimit), row.verdict]),
      ).map((line) => `  ${line}`),
    );
  }
  if (channel.aggregates.length > 0) {
    lines.push("");
    lines.push(
      ...table(
        ["aggregate", "measured", "limit", "unit", "% of limit", "verdict"],
        channel.aggregates.map((aggregate) => [
          aggregate.role === "requirement" ? aggregate.name : `${aggregate.name} (allowance)`,
          num(aggregate.measured),
          num(aggregate.limit),
          aggregate.unit,
          pct(aggregate.percentOfLimit),
          aggregate.verdict,
        ]),
      ).map((line) => `  ${line}`),
    );
  }
  for (const condition of channel.conditions) lines.push(`  condition ${condition.id}: ${condition.verdict} — ${condition.reason}`);
  // One line per distinct reason keeps "above Nyquist" × 10 readable: rows group by their
  // cause or threshold (typed fields), else by the reason text itself.
  const seen = new Set<string>();
  const explain = (name: string, key: string, reason: string): void => {
    if (seen.has(key)) return;
    seen.add(key);
    lines.push(`  ${name}: ${reason}`);
  };
  for (const row of channel.rows) {
    if (row.verdict === "pass" || !row.reason) continue;
    const key = row.threshold ? thresholdText(row.threshold) : row.cause && !row.rowRules ? causeText(row.cause) : row.reason;
    explain(`h${row.order}`, key, row.reason);
  }
  for (const aggregate of channel.aggregates) {
    if (aggregate.verdict !== "pass" && aggregate.reason) explain(aggregate.name, `${aggregate.name}: ${aggregate.reason}`, aggregate.reason);
  }
  return lines;
}

/**
 * Render an evaluation as a plain-text sheet for the CLI: a header with the limit set,
 * revision and overall verdict, then per channel the band and a table
 * order | measured | limit | unit | % of limit | verdict, the aggregates, and the reasons
 * for every row that is not a plain pass. O(rows).
 *
 * @example
 * console.log(formatComplianceTable(result))
 * // IEC 61000-3-2 Class A (iec-61000-3-2-class-a), revision 1 — FAIL
 * // channel I1: FAIL
 * //   order  measured  limit  unit  % of limit  verdict
 * //   3         2.5      2.3  A        108.7 %  fail …
 */
export function formatComplianceTable(result: ComplianceResult): string {
  const lines = [
    `${result.limitSet.name} (${result.limitSet.key}, ${result.limitSet.edition}), revision ${result.revision.number} — ${result.verdict.toUpperCase()}`,
  ];
  if (result.channels.length === 0) lines.push(`  ${result.band.reason}`);
  for (const channel of result.channels) {
    lines.push("", ...channelBlock(channel));
  }
  lines.push("", ...result.notes.map((note) => `note: ${note}`));
  return lines.join("\n");
}
