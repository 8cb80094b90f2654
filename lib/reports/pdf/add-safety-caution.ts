import { safetyText } from "../safety-text";
import { pdfColours } from "./pdf-colours";
import { pdfSafe } from "./pdf-safe";
import type { PdfWriter } from "./pdf-writer";

/**
 * The safety caution in a tinted box across the page, placed near the top so it is read with the
 * verdict. O(1).
 *
 * @example addSafetyCaution(w)
 */
export function addSafetyCaution(w: PdfWriter): void {
  const { doc, margin, width } = w;
  w.ensure(50);
  doc.moveDown(0.6);
  const y = doc.y;
  doc.font("Helvetica").fontSize(8.5);
  const h = doc.heightOfString(pdfSafe(safetyText), { width: width - 20 }) + 16;
  doc.rect(margin, y, width, h).fill(pdfColours.cautionLight);
  doc.fillColor(pdfColours.caution).font("Helvetica-Bold").text("Caution", margin + 10, y + 6, { width: width - 20 });
  doc.font("Helvetica").fillColor(pdfColours.ink).text(pdfSafe(safetyText), margin + 10, doc.y + 1, { width: width - 20 });
  doc.y = y + h + 14;
}
