import { pdfColours } from "./pdf-colours";
import { pdfSafe } from "./pdf-safe";
import type { PdfWriter } from "./pdf-writer";

/**
 * A rule and one footer line on every buffered page: `text` followed by "page N of M". Call once,
 * after the last page is written (the document must buffer its pages). O(pages).
 *
 * @example addPageFooters(w, "Kettle run 2 · iec-61000-3-2-class-a revision 1 · generated 2026-03-03 00:00 UTC")
 */
export function addPageFooters(w: PdfWriter, text: string): void {
  const { doc, margin, width } = w;
  const range = doc.bufferedPageRange();
  for (let i = range.start; i < range.start + range.count; i += 1) {
    doc.switchToPage(i);
    const savedBottom = doc.page.margins.bottom;
    doc.page.margins.bottom = 0;
    const y = doc.page.height - margin - 12;
    doc.moveTo(margin, y - 4).lineTo(margin + width, y - 4).lineWidth(0.5).strokeColor(pdfColours.line).stroke();
    doc.font("Helvetica").fontSize(7).fillColor(pdfColours.muted);
    doc.text(pdfSafe(`${text} · page ${i - range.start + 1} of ${range.count}`), margin, y, { width, lineBreak: false });
    doc.page.margins.bottom = savedBottom;
  }
}
