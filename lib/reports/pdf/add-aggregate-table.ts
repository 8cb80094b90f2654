import type { ComplianceAggregate } from "@/lib/compliance/result";
import { formatNumber, verdictLabel } from "../format";
import { decidedByLabel, formatPercentOfLimit } from "../time-rules";
import { drawTable } from "./draw-table";
import { pdfColours, verdictColours } from "./pdf-colours";
import type { PdfWriter } from "./pdf-writer";

const columns = [
  { label: "Aggregate", width: 90 },
  { label: "Measured", width: 70, align: "right" },
  { label: "Limit", width: 70, align: "right" },
  { label: "Unit", width: 45 },
  { label: "% of limit", width: 60, align: "right" },
  { label: "Verdict", width: 80 },
  { label: "Decided by", width: 100 },
] as const;

/**
 * A channel's aggregates (THD, TDD, PWHD, …) as a table: measured, limit, unit, % of limit,
 * verdict and the rule that decided it. O(aggregates).
 *
 * @example addAggregateTable(w, block.aggregates)
 */
export function addAggregateTable(w: PdfWriter, aggregates: readonly ComplianceAggregate[]): void {
  const rows = aggregates.map((a) => ({
    cells: [
      { text: a.role === "allowance-condition" ? `${a.name} (allowance)` : a.name, bold: true },
      { text: formatNumber(a.measured) },
      { text: formatNumber(a.limit) },
      { text: a.unit },
      { text: formatPercentOfLimit(a, { compact: true }) },
      { text: verdictLabel(a.verdict), colour: verdictColours(a.verdict).fg, bold: a.verdict === "fail" },
      { text: decidedByLabel(a) || "—", colour: pdfColours.soft },
    ],
  }));
  drawTable(w, columns, rows, {
    keepTogether: 30,
    head: { size: 7.5, colour: pdfColours.muted, height: 12 },
    body: { size: 8.5, colour: pdfColours.ink, height: 12 },
    gapAfter: 4,
  });
}
