import type { ComplianceRow } from "@/lib/compliance/result";
import { formatNumber } from "../format";
import { pdfColours } from "./pdf-colours";
import type { PdfWriter } from "./pdf-writer";

/** 1, 2, 2.5 or 5 × 10^k at or above x, for chart axes. */
function niceCeiling(x: number): number {
  const power = 10 ** Math.floor(Math.log10(x));
  for (const step of [1, 2, 2.5, 5, 10]) if (step * power >= x) return step * power;
  return 10 * power;
}

/**
 * A bar chart of the orders from 2 up: measured bars (red where failing) with the limit as a mark
 * over each. One unit on the axis when all rows share it, else % of limit with limits at 100 %.
 * Values above the axis are clipped. O(orders).
 *
 * @example addSpectrumChart(w, block.rows)
 */
export function addSpectrumChart(w: PdfWriter, allRows: readonly ComplianceRow[]): void {
  const { doc, margin, width } = w;
  const rows = allRows.filter((r) => r.order >= 2);
  const units = new Set(rows.filter((r) => r.limit !== null || r.measured !== null).map((r) => r.unit));
  // Mixed units cannot share an axis; then plot percent of limit with the limit at 100 %.
  const asPercent = units.size !== 1;
  const unit = asPercent ? "% of limit" : [...units][0]!;
  const measured = (r: ComplianceRow) => (asPercent ? r.percentOfLimit : r.measured);
  const limit = (r: ComplianceRow) => (asPercent ? (r.limit !== null ? 100 : null) : r.limit);
  const peak = Math.max(...rows.flatMap((r) => [measured(r) ?? 0, limit(r) ?? 0]), 1e-9);
  const tick = niceCeiling(peak / 4);
  const ticks = Math.ceil(peak / tick - 1e-9);
  const top = tick * ticks;
  const chartH = 150;
  w.ensure(chartH + 50);
  doc.moveDown(0.4);
  doc.font("Helvetica-Bold").fontSize(8.5).fillColor(pdfColours.ink);
  w.text(`Spectrum (${unit}): bars measured, marks limit`);
  const y0 = doc.y + 6;
  const left = margin + 38;
  const plotW = width - 42;
  const base = y0 + chartH;
  const yOf = (v: number) => base - (Math.min(v, top) / top) * chartH;
  // grid and y labels
  doc.font("Helvetica").fontSize(7);
  for (let k = 0; k <= ticks; k += 1) {
    const v = tick * k;
    const y = yOf(v);
    doc.moveTo(left, y).lineTo(left + plotW, y).lineWidth(0.3).strokeColor(pdfColours.line).stroke();
    doc.fillColor(pdfColours.muted).text(formatNumber(v), margin, y - 3, { width: 34, align: "right", lineBreak: false });
  }
  const first = rows[0]!.order;
  const last = rows[rows.length - 1]!.order;
  const slot = plotW / (last - first + 1);
  for (const r of rows) {
    const cx = left + (r.order - first + 0.5) * slot;
    const m = measured(r);
    if (m !== null && m > 0) {
      const h = base - yOf(m);
      doc.rect(cx - slot * 0.32, base - h, slot * 0.64, h).fill(r.verdict === "fail" ? pdfColours.fail : pdfColours.soft);
    }
    const l = limit(r);
    if (l !== null) {
      const y = yOf(l);
      doc.moveTo(cx - slot * 0.48, y).lineTo(cx + slot * 0.48, y).lineWidth(1.4).strokeColor(pdfColours.copper).stroke();
    }
    if (r.order === first || r.order % 5 === 0) {
      doc.fillColor(pdfColours.muted).text(String(r.order), cx - 10, base + 3, { width: 20, align: "center", lineBreak: false });
    }
  }
  doc.moveTo(left, base).lineTo(left + plotW, base).lineWidth(0.6).strokeColor(pdfColours.soft).stroke();
  doc.y = base + 16;
  doc.x = margin;
  doc.font("Helvetica").fontSize(7).fillColor(pdfColours.muted);
  w.text("Harmonic order. Red bars exceed their limit; copper marks are the limits; values above the top of the axis are clipped.");
}
