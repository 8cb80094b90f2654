import type { ComplianceAggregate } from "@/lib/compliance/result";
import { drawTable, type TableColumn } from "./draw-table";
import { judgedColumns as judged } from "./judged-columns";
import { pdfColours } from "./pdf-colours";
import type { PdfWriter } from "./pdf-writer";

const columns: Array<TableColumn<ComplianceAggregate>> = [
  { label: "Aggregate", width: 90, cell: (a) => ({ text: a.role === "allowance-condition" ? `${a.name} (allowance)` : a.name, bold: true }) },
  judged.measured(70),
  judged.limit(70),
  judged.unit(45),
  judged.percentOfLimit(60),
  judged.verdict(80),
  judged.decidedBy(100),
];

/**
 * A channel's aggregates (THD, TDD, PWHD, …) as a table: measured, limit, unit, % of limit,
 * verdict and the rule that decided it. O(aggregates).
 *
 * @example addAggregateTable(w, block.aggregates)
 */
export function addAggregateTable(w: PdfWriter, aggregates: readonly ComplianceAggregate[]): void {
  drawTable(w, columns, aggregates, {
    keepTogether: 30,
    head: { size: 7.5, colour: pdfColours.muted, height: 12 },
    body: { size: 8.5, colour: pdfColours.ink, height: 12 },
    gapAfter: 4,
  });
}
