import type { ComplianceRow } from "@/lib/compliance/result";
import { formatMargin, formatNumber, verdictLabel } from "../format";
import { decidedByLabel, formatPercentOfLimit, tableLimitOf } from "../time-rules";
import { drawTable } from "./draw-table";
import { pdfColours, verdictColours } from "./pdf-colours";
import type { PdfWriter } from "./pdf-writer";

// Table limit: before a time rule's multiplier; Decided by: the rule whose result is shown.
const columns = [
  { label: "Order", width: 34 },
  { label: "Measured", width: 56, align: "right" },
  { label: "Limit", width: 56, align: "right" },
  { label: "Table limit", width: 56, align: "right" },
  { label: "Unit", width: 34 },
  { label: "% of limit", width: 54, align: "right" },
  { label: "Margin", width: 54, align: "right" },
  { label: "Verdict", width: 68 },
  { label: "Decided by", width: 103 },
] as const;

/**
 * A channel's per-order table: measured, limit (after a time rule's multiplier), table limit,
 * unit, % of limit, margin, verdict and the deciding rule; failing rows tinted. Runs over pages
 * with the header repeated. O(orders).
 *
 * @example addOrderTable(w, block.rows)
 */
export function addOrderTable(w: PdfWriter, orders: readonly ComplianceRow[]): void {
  const rows = orders.map((row) => ({
    fill: row.verdict === "fail" ? pdfColours.failLight : undefined,
    cells: [
      { text: `h${row.order}`, bold: true },
      { text: formatNumber(row.measured) },
      { text: formatNumber(row.limit) },
      { text: formatNumber(tableLimitOf(row)), colour: pdfColours.soft },
      { text: row.unit },
      { text: formatPercentOfLimit(row, { compact: true }) },
      { text: formatMargin(row.margin) },
      { text: verdictLabel(row.verdict), colour: verdictColours(row.verdict).fg, bold: row.verdict === "fail" },
      { text: decidedByLabel(row) || "—", colour: pdfColours.soft },
    ],
  }));
  drawTable(w, columns, rows, {
    keepTogether: 40,
    head: { size: 7.5, colour: pdfColours.soft, height: 13, fill: pdfColours.idleLight },
    body: { size: 8, colour: pdfColours.ink, height: 11 },
    gapAfter: 2,
  });
}
