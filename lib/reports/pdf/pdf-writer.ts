import "server-only";
import type PDFDocument from "pdfkit";
import { pdfColours } from "./pdf-colours";
import { pdfSafe } from "./pdf-safe";

/** Page margin on every side, pt. */
export const PAGE_MARGIN = 40;
/** Room kept above the bottom margin for the footer line of every page, pt. */
const FOOTER_SPACE = 36;

/**
 * The page geometry and the text primitives every section of the sheet PDF uses: a heading with
 * its rule, key/value rows, text across the page, and a new page when the next block does not fit
 * above the footer. Every string goes through pdfSafe. Holds no state of its own besides the document.
 *
 * @example
 * const w = new PdfWriter(new PDFDocument({ size: "A4", margin: PAGE_MARGIN }));
 * w.heading("Notes"); w.keyValues([["File", "run2.csv"]]);
 */
export class PdfWriter {
  readonly margin = PAGE_MARGIN;
  /** Printable width, pt. */
  readonly width: number;

  constructor(readonly doc: InstanceType<typeof PDFDocument>) {
    this.width = doc.page.width - 2 * PAGE_MARGIN;
  }

  /** The lowest y a block may reach on this page (above the footer). */
  bottom(): number {
    return this.doc.page.height - this.margin - FOOTER_SPACE;
  }

  /** Starts a new page; returns its top y. */
  newPage(): number {
    this.doc.addPage();
    this.doc.y = this.margin;
    return this.margin;
  }

  /** A new page unless `height` pt still fit below the current position. */
  ensure(height: number): void {
    if (this.doc.y + height > this.bottom()) this.newPage();
  }

  /** Text across the printable width at the current position, in the current font. */
  text(s: string, opts: PDFKit.Mixins.TextOptions = {}): void {
    this.doc.text(pdfSafe(s), this.margin, this.doc.y, { width: this.width, ...opts });
  }

  /** A section heading with a rule under it; leaves the body font (Helvetica 9, ink) set. */
  heading(s: string): void {
    const { doc, margin, width } = this;
    this.ensure(40);
    doc.moveDown(0.6);
    doc.font("Helvetica-Bold").fontSize(11).fillColor(pdfColours.ink);
    this.text(s);
    const y = doc.y + 2;
    doc.moveTo(margin, y).lineTo(margin + width, y).lineWidth(0.5).strokeColor(pdfColours.line).stroke();
    doc.y = y + 5;
    doc.font("Helvetica").fontSize(9).fillColor(pdfColours.ink);
  }

  /** Rows of a muted key beside its value; each row as tall as the taller of the two when wrapped. */
  keyValues(pairs: ReadonlyArray<readonly [string, string]>): void {
    const { doc, margin, width } = this;
    const keyWidth = 120;
    for (const [k, v] of pairs) {
      doc.font("Helvetica").fontSize(9);
      // The taller of the two columns: a long key (e.g. "Voltages Va (V), Vb (V), Vc (V)") wraps too.
      const h = Math.max(doc.heightOfString(pdfSafe(v), { width: width - keyWidth }), doc.heightOfString(pdfSafe(k), { width: keyWidth - 8 }), 11);
      this.ensure(h + 2);
      const y = doc.y;
      doc.fillColor(pdfColours.muted).text(pdfSafe(k), margin, y, { width: keyWidth - 8 });
      doc.fillColor(pdfColours.ink).text(pdfSafe(v), margin + keyWidth, y, { width: width - keyWidth });
      doc.y = y + h + 2;
    }
    doc.x = margin;
  }
}
