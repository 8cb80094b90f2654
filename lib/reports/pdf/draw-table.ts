import { pdfSafe } from "./pdf-safe";
import type { PdfWriter } from "./pdf-writer";

export interface TableColumn {
  label: string;
  /** pt */
  width: number;
  align?: "left" | "right";
}

export interface TableCell {
  text: string;
  colour?: string;
  bold?: boolean;
}

export interface TableRow {
  cells: TableCell[];
  /** Background of the row across the page (e.g. a failing order). */
  fill?: string;
}

export interface TableStyle {
  /** Room wanted below the current position before the header, pt (a new page otherwise). */
  keepTogether: number;
  /** `fill`: a band across the page behind the header. */
  head: { size: number; colour: string; height: number; fill?: string };
  body: { size: number; colour: string; height: number };
  /** Colour of a thin rule under each body row; none when absent. */
  rule?: string;
  /** Space left below the last row, pt. */
  gapAfter: number;
}

/**
 * A table of one-line cells (too long a text ends in an ellipsis) at the current position; a row
 * that would reach the footer starts a new page, which repeats the header row. Left at the
 * left margin below the table. O(rows × columns).
 *
 * Own drawing rather than pdfkit's `doc.table()`: in pdfkit 0.20 a table that runs onto the next
 * page does not repeat its header row, and it breaks at the page's bottom margin, over the footer.
 *
 * @example drawTable(w, [{ label: "Order", width: 40 }], [{ cells: [{ text: "h3" }] }], style)
 */
export function drawTable(w: PdfWriter, columns: readonly TableColumn[], rows: readonly TableRow[], style: TableStyle): void {
  const { doc, margin } = w;
  const tableWidth = columns.reduce((sum, c) => sum + c.width, 0);
  const cells = (row: readonly TableCell[], y: number, size: number, colour: string) => {
    let x = margin;
    row.forEach((c, i) => {
      const column = columns[i]!;
      doc.font(c.bold ? "Helvetica-Bold" : "Helvetica").fontSize(size).fillColor(c.colour ?? colour);
      doc.text(pdfSafe(c.text), x + 3, y, { width: column.width - 6, align: column.align ?? "left", lineBreak: false, ellipsis: true, height: size + 3 });
      x += column.width;
    });
  };
  const drawHead = (y: number): number => {
    const { head } = style;
    if (head.fill) doc.rect(margin, y - 2, w.width, head.height - 1).fill(head.fill);
    cells(columns.map((c) => ({ text: c.label, bold: true })), y, head.size, head.colour);
    if (style.rule) doc.moveTo(margin, y + head.height - 1).lineTo(margin + tableWidth, y + head.height - 1).lineWidth(0.3).strokeColor(style.rule).stroke();
    return y + head.height;
  };

  w.ensure(style.keepTogether);
  doc.moveDown(0.3);
  let y = drawHead(doc.y);
  for (const row of rows) {
    if (y + style.body.height > w.bottom()) y = drawHead(w.newPage());
    if (row.fill) doc.rect(margin, y - 2, w.width, style.body.height).fill(row.fill);
    cells(row.cells, y, style.body.size, style.body.colour);
    if (style.rule) doc.moveTo(margin, y + style.body.height - 1).lineTo(margin + tableWidth, y + style.body.height - 1).lineWidth(0.3).strokeColor(style.rule).stroke();
    y += style.body.height;
  }
  doc.y = y + style.gapAfter;
  doc.x = margin;
}
