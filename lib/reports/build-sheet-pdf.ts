import "server-only";
import PDFDocument from "pdfkit";
import { formatWhen, verdictLabel } from "./format";
import { addChannel } from "./pdf/add-channel";
import { addMitigationStudies, type StudyForReport } from "./pdf/add-mitigation-studies";
import { addPageFooters } from "./pdf/add-page-footers";
import { addSafetyCaution } from "./pdf/add-safety-caution";
import { addSignOff } from "./pdf/add-sign-off";
import { addSummary } from "./pdf/add-summary";
import { addTimeRules } from "./pdf/add-time-rules";
import { pdfColours } from "./pdf/pdf-colours";
import { pdfSafe } from "./pdf/pdf-safe";
import { PAGE_MARGIN, PdfWriter } from "./pdf/pdf-writer";
import { channelBlocks, type SheetReport } from "./sheet-report";

export interface SheetPdfOptions {
  /** Deflate page streams (default true). Tests turn it off to read the text. */
  compress?: boolean;
  /** Print review comments (off for share links: comments are internal). Default true. */
  includeComments?: boolean;
  /** Printed in the footer; injected so tests are reproducible. */
  generatedAt?: Date;
  /** Saved mitigation studies chosen for the report: one "Mitigation study — prediction" page each. */
  studies?: readonly StudyForReport[];
}

/**
 * The sheet as an A4 PDF: summary with the overall verdict, limit set with standard edition and
 * revision, band and context, the time rules (applied or why not, and the record they used), the
 * safety caution, per channel the aggregates, a vector spectrum bar chart with limit marks and the
 * per-order table (with the table limit and the rule that decided each verdict), notes, the
 * sign-off history and the chosen mitigation studies. The sheet's sections are in `lib/reports/pdf/`.
 * Resolves to the whole file in memory (a sheet is a few pages). O(channels × orders).
 *
 * @example
 * const pdf = await buildSheetPdf(await loadSheet({ captureId, role }));
 * pdf.subarray(0, 4).toString() // "%PDF"
 */
export function buildSheetPdf(sheet: SheetReport, options: SheetPdfOptions = {}): Promise<Buffer> {
  const evaluation = sheet.evaluation;
  if (!evaluation) throw new Error("the capture has no evaluation to report");
  const result = evaluation.result;
  const generatedAt = options.generatedAt ?? new Date();
  const doc = new PDFDocument({
    size: "A4",
    margin: PAGE_MARGIN,
    compress: options.compress ?? true,
    bufferPages: true,
    info: { Title: pdfSafe(`Harmonic emission sheet — ${sheet.capture.title}`), Author: "Ordwise", Subject: pdfSafe(evaluation.limitSetName) },
  });
  const chunks: Buffer[] = [];
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on("data", (chunk: Buffer) => chunks.push(chunk));
    doc.on("end", () => resolve(Buffer.concat(chunks)));
    doc.on("error", reject);
  });
  const w = new PdfWriter(doc);

  addSummary(w, sheet);
  const blocks = channelBlocks(result);
  addTimeRules(w, result, blocks[0]);
  addSafetyCaution(w);

  if (blocks.length > 1) {
    w.heading("Channels");
    w.keyValues(blocks.map((b) => [b.channel, `${verdictLabel(b.verdict)} — band ${b.band.label ?? "none"}`]));
  }
  blocks.forEach((block, index) => addChannel(w, block, { withBand: blocks.length > 1, withChart: index === 0 }));

  if (result.notes.length > 0) {
    w.heading("Notes");
    doc.font("Helvetica").fontSize(8.5).fillColor(pdfColours.soft);
    for (const note of result.notes) {
      w.ensure(20);
      w.text(`• ${note}`);
    }
  }
  addSignOff(w, sheet, { includeComments: options.includeComments !== false });
  if (options.studies?.length) addMitigationStudies(w, options.studies);

  addPageFooters(w, `${sheet.capture.title} · ${evaluation.limitSetName}, revision ${evaluation.revisionNumber} · generated ${formatWhen(generatedAt)}`);
  doc.end();
  return done;
}
