import { formatOrders, groupReasons, verdictLabel } from "../format";
import type { ChannelBlock } from "../sheet-report";
import { conditionReasonText } from "../result-wording";
import { tableLimitIfDifferent } from "../time-rules";
import { addAggregateTable } from "./add-aggregate-table";
import { addOrderTable } from "./add-order-table";
import { addSpectrumChart } from "./add-spectrum-chart";
import { pdfColours } from "./pdf-colours";
import type { PdfWriter } from "./pdf-writer";

/**
 * One channel's section: heading with its verdict (and band when there are several channels), the
 * derived-value notes, the aggregate table, the spectrum chart (`withChart`: the first channel
 * only), the per-order table, the not-evaluated reasons grouped by order and the conditions.
 * O(orders).
 *
 * @example channelBlocks(result).forEach((b, i, all) => addChannel(w, b, { withBand: all.length > 1, withChart: i === 0 }))
 */
export function addChannel(w: PdfWriter, block: ChannelBlock, { withBand, withChart }: { withBand: boolean; withChart: boolean }): void {
  const { doc } = w;
  w.heading(`Channel ${block.channel}: ${verdictLabel(block.verdict)}`);
  if (withBand) w.keyValues([["Band", `${block.band.label ?? "none chosen"} — ${block.band.reason}`]]);
  for (const note of block.derived.notes) w.text(note);
  if (block.aggregates.length > 0) addAggregateTable(w, block.aggregates);
  if (withChart && block.rows.some((r) => r.order >= 2)) addSpectrumChart(w, block.rows);
  addOrderTable(w, block.rows);
  if (block.rows.some((r) => r.decidedBy !== undefined && tableLimitIfDifferent(r) !== null)) {
    doc.font("Helvetica").fontSize(7.5).fillColor(pdfColours.soft);
    w.text("% of limit is against the table limit; where a time rule allows more (e.g. ×1.5 = 150 %), the multiplier is in Decided by and the rule's limit in Limit.");
  }
  const reasons = groupReasons(block.rows);
  if (reasons.length > 0) {
    doc.moveDown(0.4);
    doc.font("Helvetica").fontSize(8).fillColor(pdfColours.soft);
    for (const { orders, reason } of reasons) {
      w.ensure(20);
      w.text(`Order ${formatOrders(orders)}: ${reason}`);
    }
  }
  for (const c of block.conditions) {
    w.ensure(20);
    doc.font("Helvetica").fontSize(8).fillColor(pdfColours.soft);
    w.text(`Condition (${c.verdict === "pass" ? "holds" : "not evaluated"}): ${c.text} — ${conditionReasonText(c)}`);
  }
}
