import { pdfSafe } from "./pdf-safe";
import type { PdfWriter } from "./pdf-writer";

export interface TableCell {
  text: string;
  colour?: string;
  bold?: boolean;
}

/** One column: its header, width, alignment and what it prints for an item. */
export interface TableColumn<T> {
  label: string;
  /** pt */
  width: number;
  align?: "left" | "right";
  cell: (item: T) => TableCell | string;
}

export interface TableStyle<T> {
  /** Room wanted below the current position before the header, pt (a new page otherwise). */
  keepTogether: number;
  /** `fill`: a band across the page behind the header. */
  head: { size: number; colour: string; height: number; fill?: string };
  body: { size: number; colour: string; height: number };
  /** Colour of a thin rule under each body row; none when absent. */
  rule?: string;
  /** Space left below the last row, pt. */
  gapAfter: number;
  /** Background of an item's row across the page (e.g. a failing order); none when undefined. */
  rowFill?: (item: T) => string | undefined;
}

/**
 * A table of one-line cells (too long a text ends in an ellipsis) at the current position; a row
 * that would reach the footer starts a new page, which repeats the header row. Left at the
 * left margin below the table. O(rows × columns).
 *
 * Own drawing rather than pdfkit's `doc.table()`: in pdfkit 0.20 a table that runs onto the next
 * page does not repeat its header row, and it breaks at the page's bottom margin, over the footer.
 *
 * @example drawTable(w, [{ label: "Order", width: 40, cell: (r) => `h${r.order}` }], rows, style)
 */
export function drawTable<T>(w: PdfWriter, columns: ReadonlyArray<TableColumn<T>>, items: readonly T[], style: TableStyle<T>): void {
  const { doc, margin } = w;
  const tableWidth = columns.reduce((sum, c) => sum + c.width, 0);
  const cells = (row: ReadonlyArray<TableCell | string>, y: number, size: number, colour: string) => {
    let x = margin;
    row.forEach((cell, i) => {
      const column = columns[i]!;
      const c = typeof cell === "string" ? { text: cell } : cell;
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
  for (const item of items) {
    if (y + style.body.height > w.bottom()) y = drawHead(w.newPage());
    const fill = style.rowFill?.(item);
    if (fill) doc.rect(margin, y - 2, w.width, style.body.height).fill(fill);
    cells(columns.map((c) => c.cell(item)), y, style.body.size, style.body.colour);
    if (style.rule) doc.moveTo(margin, y + style.body.height - 1).lineTo(margin + tableWidth, y + style.body.height - 1).lineWidth(0.3).strokeColor(style.rule).stroke();
    y += style.body.height;
  }
  doc.y = y + style.gapAfter;
  doc.x = margin;
}
