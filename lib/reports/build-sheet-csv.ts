import Papa from "papaparse";
import { formatWhen, summariseContext } from "./format";
import { headlineNumbers } from "./headline-numbers";
import { headlineTable } from "./headline-table";
import { channelBlocks, type SheetReport } from "./sheet-report";
import { decidedByLabel, describeTimeBasis, percentOfTableLimit, tableLimitOf } from "./time-rules";
import { powerChoiceRows, timeRuleSummaryNote } from "./result-wording";

type Cell = string | number | null | undefined;

/** A cell as papaparse should write it: numbers stay numbers (eight significant figures), non-finite ones and nulls empty. */
function cell(value: Cell): string | number {
  if (value === null || value === undefined) return "";
  if (typeof value === "number") return Number.isFinite(value) ? Number(value.toPrecision(8)) : "";
  return value;
}

/**
 * RFC 4180 lines by papaparse. Text starting with =, +, -, @, tab or carriage return gets a leading
 * apostrophe (papaparse's `escapeFormulae`) so a spreadsheet shows it instead of running it as a formula;
 * numbers are written as numbers, so a negative margin such as -0.2 stays a number.
 */
const line = (cells: Cell[]) => Papa.unparse([cells.map(cell)], { escapeFormulae: true, newline: "\r\n" });

/**
 * The pass/fail sheet as CSV: a header block (capture, site, limit set, revision, band, context,
 * verdict, time rules and their basis), the headline numbers (one small table each for currents,
 * voltages, power and unbalance, raw values, units in the column labels; an interval log's logged
 * statistics with what they were taken over, and "not logged" for what the log lacks), a blank line, then one row per channel and order with
 * channel, order, measured, limit, unit, percent_of_limit, margin, verdict, decided_by (the deciding
 * rule in words, e.g. "max 1.5 s smoothed ×1.5" — never an internal id), table_limit (before a
 * rule's multiplier), reason; then, after a blank line,
 * the aggregates (THD, TDD, THC, PWHC, POHC) in the same columns. When a time rule decided a row,
 * measured/limit/margin are that rule's statistic and limit × multiplier; percent_of_limit is
 * always against the table limit (the rule's multiplier is in decided_by).
 * Numbers keep eight significant figures (no display rounding). O(channels × orders).
 *
 * @example
 * buildSheetCsv(sheet).split("\n")[0] // "Capture,Drive 3 after filter"
 */
export function buildSheetCsv(sheet: SheetReport): string {
  const evaluation = sheet.evaluation;
  if (!evaluation) throw new Error("the capture has no evaluation to export");
  const r = evaluation.result;
  const head: Array<Array<string | number | null>> = [
    ["Capture", sheet.capture.title],
    ["Capture id", sheet.capture.id],
    ["Site", sheet.site.name],
    ["File", sheet.capture.originalFilename],
    ["Captured", sheet.capture.capturedAt ? formatWhen(sheet.capture.capturedAt) : "not given"],
    ["Uploaded", `${formatWhen(sheet.capture.createdAt)}${sheet.uploaderName ? ` by ${sheet.uploaderName}` : ""}`],
    ["Limit set", evaluation.limitSetName],
    ["Standard", `${r.limitSet.standard}, ${r.limitSet.edition}`],
    ["Revision", evaluation.revisionNumber],
    ["Evaluation", `${evaluation.id} at ${formatWhen(evaluation.createdAt)}${evaluation.createdByName ? ` by ${evaluation.createdByName}` : ""}`],
    ["Band", `${r.band.label ?? "none"}: ${r.band.reason}`],
    ["Context", summariseContext(r.context)],
    ...(r.power ? powerChoiceRows(r.power) : []),
    ["Overall verdict", r.verdict],
  ];
  if (r.timeBasis) head.push(...describeTimeBasis(r.timeBasis).map(([k, v]): [string, string] => [`Time basis: ${k.toLowerCase()}`, v]));
  for (const rule of r.timeRules ?? []) {
    const status = rule.status === "applied" ? `applied, ${rule.failures} over its limit` : `not evaluated: ${timeRuleSummaryNote(rule) ?? "no reason given"}`;
    head.push(["Time rule", `${rule.label} (limit × ${rule.multiplier}) — ${status}`]);
  }
  const blocks = channelBlocks(r);
  const lines = head.map(line);
  // Headline numbers: one small table per quantity / power / unbalance, raw values, units in the labels.
  const headline = headlineNumbers(sheet.analysis?.result, r.context);
  for (const table of headline ? headlineTable(headline) : []) {
    lines.push("");
    lines.push(line([`Headline numbers: ${table.title.toLowerCase()}`, ...table.columns.map((c) => c.label)]));
    if (table.caption) lines.push(line(["Taken over", table.caption]));
    for (const row of table.rows) lines.push(line([row.label, ...row.values]));
  }
  lines.push("");
  lines.push(line(["channel", "order", "measured", "limit", "unit", "percent_of_limit", "margin", "verdict", "decided_by", "table_limit", "reason"]));
  for (const block of blocks) {
    for (const row of block.rows) {
      lines.push(line([block.channel, row.order, row.measured, row.limit, row.unit, percentOfTableLimit(row), row.margin, row.verdict, decidedByLabel(row), tableLimitOf(row), row.reason ?? ""]));
    }
  }
  // The aggregates (THD, TDD, THC, PWHC, POHC) with their verdicts, in the same columns.
  lines.push("");
  lines.push(line(["channel", "aggregate", "measured", "limit", "unit", "percent_of_limit", "margin", "verdict", "decided_by", "table_limit", "reason"]));
  for (const block of blocks) {
    for (const a of block.aggregates) {
      const name = a.role === "requirement" ? a.name : `${a.name} (allowance condition)`;
      lines.push(line([block.channel, name, a.measured, a.limit, a.unit, percentOfTableLimit(a), a.margin, a.verdict, decidedByLabel(a), tableLimitOf(a), a.reason ?? ""]));
    }
  }
  return lines.join("\r\n") + "\r\n";
}
