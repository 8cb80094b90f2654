import { describeContext, formatNumber, formatWhen, verdictLabel } from "../format";
import { describeSetup } from "../describe-setup";
import { describeSignOff } from "../describe-sign-off";
import { headlineNumbers } from "../headline-numbers";
import { headlineTable } from "../headline-table";
import { limitsLine } from "../limits-line";
import { powerChoiceRows } from "../result-wording";
import type { SheetReport } from "../sheet-report";
import { pdfColours, verdictColours } from "./pdf-colours";
import { pdfSafe } from "./pdf-safe";
import type { PdfWriter } from "./pdf-writer";

/**
 * Page 1 of the sheet PDF down to the evaluation context: the title and site, the overall verdict,
 * file, limit set with standard, edition and revision, band, power choice and sign-off state; the
 * set-up behind the result; the limits line (verified against the printed edition or not); the
 * headline numbers; the evaluation context. O(channels).
 *
 * @example addSummary(w, sheet)
 */
export function addSummary(w: PdfWriter, sheet: SheetReport): void {
  const { doc, margin, width } = w;
  const evaluation = sheet.evaluation!;
  const result = evaluation.result;

  doc.rect(margin, margin, 9, 9).fill(pdfColours.copper);
  doc.font("Helvetica").fontSize(9).fillColor(pdfColours.muted).text("Ordwise · harmonic emission sheet", margin + 14, margin, { width: width - 14 });
  doc.y = margin + 16;
  doc.font("Helvetica-Bold").fontSize(16).fillColor(pdfColours.ink);
  w.text(sheet.capture.title);
  doc.font("Helvetica").fontSize(9.5).fillColor(pdfColours.soft);
  w.text(`${sheet.site.name} · ${formatNumber(sheet.site.nominalVoltageV)} V · ${sheet.site.frequencyHz} Hz`);
  doc.moveDown(0.5);

  const vc = verdictColours(result.verdict);
  const boxY = doc.y;
  doc.rect(margin, boxY, width, 26).fill(vc.bg);
  doc.font("Helvetica-Bold").fontSize(12).fillColor(vc.fg).text(`Overall verdict: ${verdictLabel(result.verdict).toUpperCase()}`, margin + 10, boxY + 8, { width: width - 20 });
  doc.y = boxY + 34;

  w.keyValues([
    ["File", sheet.capture.originalFilename],
    ["Captured", sheet.capture.capturedAt ? formatWhen(sheet.capture.capturedAt) : "not given"],
    ["Uploaded", `${formatWhen(sheet.capture.createdAt)}${sheet.uploaderName ? ` by ${sheet.uploaderName}` : ""}`],
    ["Limit set", evaluation.limitSetName],
    ["Standard and edition", `${result.limitSet.standard}, ${result.limitSet.edition}`],
    ["Scope", result.limitSet.scope],
    ["Limit-set revision", `Revision ${evaluation.revisionNumber}`],
    ["Evaluated", `${formatWhen(evaluation.createdAt)}${evaluation.createdByName ? ` by ${evaluation.createdByName}` : " (automatic, after analysis)"}`],
    ["Band", `${result.band.label ?? "none chosen"} — ${result.band.reason}`],
    ...(result.power ? powerChoiceRows(result.power) : []),
    ["Sign-off", describeSignOff(sheet).label],
  ]);
  // The limits line: which table and revision, and whether it was verified against the printed edition.
  const limits = limitsLine({ standard: result.limitSet.standard, edition: result.limitSet.edition, revisionNumber: evaluation.revisionNumber, verification: sheet.limitsVerification ?? null });
  doc.font(limits.verified ? "Helvetica" : "Helvetica-Bold").fontSize(9);
  const h = doc.heightOfString(pdfSafe(limits.text), { width: width - 20 }) + 10;
  w.ensure(h + 6);
  const y = doc.y + 2;
  doc.rect(margin, y, width, h).fill(limits.verified ? pdfColours.passLight : pdfColours.cautionLight);
  doc.fillColor(limits.verified ? pdfColours.pass : pdfColours.caution).text(pdfSafe(limits.text), margin + 10, y + 5, { width: width - 20 });
  doc.y = y + h + 4;
  doc.font("Helvetica").fontSize(9).fillColor(pdfColours.ink);

  // Headline numbers on page 1, one line per channel / pair, labels with units.
  const headline = headlineNumbers(sheet.analysis?.result, result.context);
  if (headline) {
    for (const table of headlineTable(headline)) {
      w.heading(`Headline numbers — ${table.title.toLowerCase()}`);
      if (table.caption) w.text(table.caption, { continued: false });
      // A list (what an interval log lacks) needs no column label beside each statement.
      w.keyValues(table.rows.map((r): [string, string] => [r.label, table.list ? r.cells[0]! : table.columns.map((c, i) => `${c.label} ${r.cells[i]}`).join(" · ")]));
    }
  }

  // The set-up after the headline numbers, so those stay on page 1 (an interval log's
  // column-by-column list stays on the web sheet, on demand).
  const setupRows = describeSetup(sheet);
  if (setupRows.length > 0) {
    w.heading("Set-up behind this result");
    w.keyValues(setupRows.map(([label, value]): [string, string] => [label, value]));
  }

  w.heading("Evaluation context");
  const context = describeContext(result.context);
  if (context.length > 0) w.keyValues(context);
  else w.text("No context values were given.", { continued: false });
}
