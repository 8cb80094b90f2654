import type { ComplianceAggregate, ComplianceRow } from "@/lib/compliance/result";
import { formatMargin, formatNumber, verdictLabel } from "../format";
import { decidedByLabel, formatPercentOfLimit, tableLimitOf } from "../time-rules";
import type { TableColumn } from "./draw-table";
import { pdfColours, verdictColours } from "./pdf-colours";

type Judged = ComplianceRow | ComplianceAggregate;

/**
 * The columns a judged value (an order row or an aggregate) shares in the sheet PDF's tables, each
 * given its width in pt: measured, limit (after a time rule's multiplier), table limit, unit,
 * % of the table limit, margin, verdict and the rule that decided it.
 *
 * @example drawTable(w, [nameColumn, judgedColumns.measured(70), judgedColumns.verdict(80)], aggregates, style)
 */
export const judgedColumns = {
  measured: (width: number): TableColumn<Judged> => ({ label: "Measured", width, align: "right", cell: (x) => formatNumber(x.measured) }),
  limit: (width: number): TableColumn<Judged> => ({ label: "Limit", width, align: "right", cell: (x) => formatNumber(x.limit) }),
  tableLimit: (width: number): TableColumn<Judged> => ({ label: "Table limit", width, align: "right", cell: (x) => ({ text: formatNumber(tableLimitOf(x)), colour: pdfColours.soft }) }),
  unit: (width: number): TableColumn<Judged> => ({ label: "Unit", width, cell: (x) => x.unit }),
  percentOfLimit: (width: number): TableColumn<Judged> => ({ label: "% of limit", width, align: "right", cell: (x) => formatPercentOfLimit(x, { compact: true }) }),
  margin: (width: number): TableColumn<Judged> => ({ label: "Margin", width, align: "right", cell: (x) => formatMargin(x.margin) }),
  verdict: (width: number): TableColumn<Judged> => ({
    label: "Verdict",
    width,
    cell: (x) => ({ text: verdictLabel(x.verdict), colour: verdictColours(x.verdict).fg, bold: x.verdict === "fail" }),
  }),
  decidedBy: (width: number): TableColumn<Judged> => ({ label: "Decided by", width, cell: (x) => ({ text: decidedByLabel(x) || "—", colour: pdfColours.soft }) }),
};
