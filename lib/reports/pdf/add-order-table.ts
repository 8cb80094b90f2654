import type { ComplianceRow } from "@/lib/compliance/result";
import { drawTable, type TableColumn } from "./draw-table";
import { judgedColumns as judged } from "./judged-columns";
import { pdfColours } from "./pdf-colours";
import type { PdfWriter } from "./pdf-writer";

// Table limit: before a time rule's multiplier; Decided by: the rule whose result is shown.
const columns: Array<TableColumn<ComplianceRow>> = [
  { label: "Order", width: 34, cell: (row) => ({ text: `h${row.order}`, bold: true }) },
  judged.measured(56),
  judged.limit(56),
  judged.tableLimit(56),
  judged.unit(34),
  judged.percentOfLimit(54),
  judged.margin(54),
  judged.verdict(68),
  judged.decidedBy(103),
];

/**
 * A channel's per-order table: measured, limit (after a time rule's multiplier), table limit,
 * unit, % of limit, margin, verdict and the deciding rule; failing rows tinted. Runs over pages
 * with the header repeated. O(orders).
 *
 * @example addOrderTable(w, block.rows)
 */
export function addOrderTable(w: PdfWriter, rows: readonly ComplianceRow[]): void {
  drawTable(w, columns, rows, {
    keepTogether: 40,
    head: { size: 7.5, colour: pdfColours.soft, height: 13, fill: pdfColours.idleLight },
    body: { size: 8, colour: pdfColours.ink, height: 11 },
    gapAfter: 2,
    rowFill: (row) => (row.verdict === "fail" ? pdfColours.failLight : undefined),
  });
}
