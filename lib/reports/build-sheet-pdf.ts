import "server-only";
import PDFDocument from "pdfkit";
import type { ChannelCompliance, ComplianceRow } from "@/lib/compliance/result";
import {
  describeContext,
  formatMargin,
  formatNumber,
  formatOrders,
  formatWhen,
  groupReasons,
  reviewActionLabels,
  verdictLabel,
} from "./format";
import { addMitigationStudyPages, type StudyForReport } from "./mitigation-study-pages";
import { headlineNumbers } from "./headline-numbers";
import { headlineTable } from "./headline-table";
import { limitsLine } from "./limits-line";
import { safetyText } from "./safety-text";
import { describeSetup } from "./describe-setup";
import { describeSignOff } from "./describe-sign-off";
import { channelBlocks, type SheetReport } from "./sheet-report";
import { conditionReasonText, powerChoiceRows } from "./result-wording";
import { decidedByLabel, describeTimeBasis, formatPercentOfLimit, tableLimitIfDifferent, formatMultiplier, tableLimitOf, timeRuleLines } from "./time-rules";

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

const colours = {
  ink: "#1d2a3a",
  soft: "#3c4b5e",
  muted: "#6b788a",
  line: "#ddd6ca",
  copper: "#b4582a",
  pass: "#1f7a4d",
  passLight: "#dcefe4",
  fail: "#b3261e",
  failLight: "#f7dcd9",
  caution: "#8a6100",
  cautionLight: "#f8ecc9",
  idle: "#5d6b7c",
  idleLight: "#e6e9ee",
};

function verdictColours(verdict: string): { fg: string; bg: string } {
  if (verdict === "pass") return { fg: colours.pass, bg: colours.passLight };
  if (verdict === "fail") return { fg: colours.fail, bg: colours.failLight };
  if (verdict === "incomplete") return { fg: colours.caution, bg: colours.cautionLight };
  return { fg: colours.idle, bg: colours.idleLight };
}

// The 14 standard PDF fonts only cover WinAnsi; map the few symbols the evaluator's wording uses
// and replace anything else rather than print a wrong glyph.
const replacements: Record<string, string> = { "λ": "lambda", "≤": "<=", "≥": ">=", "≈": "~", "Σ": "sum", "√": "sqrt", "−": "-", "→": "->", "′": "'", "μ": "µ", "Ω": "ohm" };
const winAnsiExtra = new Set("€‚ƒ„…†‡ˆ‰Š‹ŒŽ‘’“”•–—˜™š›œžŸ");
function pdfSafe(text: string): string {
  let out = "";
  for (const ch of text) {
    const code = ch.codePointAt(0) ?? 0;
    if ((code >= 0x20 && code <= 0x7e) || (code >= 0xa0 && code <= 0xff) || winAnsiExtra.has(ch) || ch === "\n") out += ch;
    else out += replacements[ch] ?? "?";
  }
  return out;
}

const margin = 40;
const footerSpace = 36;

/**
 * The sheet as an A4 PDF: summary with the overall verdict, limit set with standard edition and
 * revision, band and context, the time rules (applied or why not, and the record they used), the
 * safety caution, per channel the aggregates, a vector spectrum bar chart with limit marks and the
 * per-order table (with the table limit and the rule that decided each verdict), notes, and the
 * sign-off history.
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
    margin,
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

  const width = doc.page.width - 2 * margin;
  const bottom = () => doc.page.height - margin - footerSpace;
  const ensure = (height: number) => {
    if (doc.y + height > bottom()) {
      doc.addPage();
      doc.y = margin;
    }
  };
  const text = (s: string, opts: PDFKit.Mixins.TextOptions = {}) => doc.text(pdfSafe(s), margin, doc.y, { width, ...opts });
  const heading = (s: string) => {
    ensure(40);
    doc.moveDown(0.6);
    doc.font("Helvetica-Bold").fontSize(11).fillColor(colours.ink);
    text(s);
    const y = doc.y + 2;
    doc.moveTo(margin, y).lineTo(margin + width, y).lineWidth(0.5).strokeColor(colours.line).stroke();
    doc.y = y + 5;
    doc.font("Helvetica").fontSize(9).fillColor(colours.ink);
  };
  const keyValues = (pairs: Array<[string, string]>) => {
    const keyWidth = 120;
    for (const [k, v] of pairs) {
      doc.font("Helvetica").fontSize(9);
      // The taller of the two columns: a long key (e.g. "Voltages Va (V), Vb (V), Vc (V)") wraps too.
      const h = Math.max(doc.heightOfString(pdfSafe(v), { width: width - keyWidth }), doc.heightOfString(pdfSafe(k), { width: keyWidth - 8 }), 11);
      ensure(h + 2);
      const y = doc.y;
      doc.fillColor(colours.muted).text(pdfSafe(k), margin, y, { width: keyWidth - 8 });
      doc.fillColor(colours.ink).text(pdfSafe(v), margin + keyWidth, y, { width: width - keyWidth });
      doc.y = y + h + 2;
    }
    doc.x = margin;
  };

  // --- summary -------------------------------------------------------------------------------
  doc.rect(margin, margin, 9, 9).fill(colours.copper);
  doc.font("Helvetica").fontSize(9).fillColor(colours.muted).text("Ordwise · harmonic emission sheet", margin + 14, margin, { width: width - 14 });
  doc.y = margin + 16;
  doc.font("Helvetica-Bold").fontSize(16).fillColor(colours.ink);
  text(sheet.capture.title);
  doc.font("Helvetica").fontSize(9.5).fillColor(colours.soft);
  text(`${sheet.site.name} · ${formatNumber(sheet.site.nominalVoltageV)} V · ${sheet.site.frequencyHz} Hz`);
  doc.moveDown(0.5);

  const verdict = result.verdict;
  const vc = verdictColours(verdict);
  const boxY = doc.y;
  doc.rect(margin, boxY, width, 26).fill(vc.bg);
  doc.font("Helvetica-Bold").fontSize(12).fillColor(vc.fg).text(`Overall verdict: ${verdictLabel(verdict).toUpperCase()}`, margin + 10, boxY + 8, { width: width - 20 });
  doc.y = boxY + 34;

  keyValues([
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
  {
    doc.font(limits.verified ? "Helvetica" : "Helvetica-Bold").fontSize(9);
    const h = doc.heightOfString(pdfSafe(limits.text), { width: width - 20 }) + 10;
    ensure(h + 6);
    const y = doc.y + 2;
    doc.rect(margin, y, width, h).fill(limits.verified ? colours.passLight : colours.cautionLight);
    doc.fillColor(limits.verified ? colours.pass : colours.caution).text(pdfSafe(limits.text), margin + 10, y + 5, { width: width - 20 });
    doc.y = y + h + 4;
    doc.font("Helvetica").fontSize(9).fillColor(colours.ink);
  }

  // Headline numbers on page 1, one line per channel / pair, labels with units.
  const headline = headlineNumbers(sheet.analysis?.result, result.context);
  if (headline) {
    for (const table of headlineTable(headline)) {
      heading(`Headline numbers — ${table.title.toLowerCase()}`);
      keyValues(table.rows.map((r): [string, string] => [r.label, table.columns.map((c, i) => `${c.label} ${r.cells[i]}`).join(" · ")]));
    }
  }
  // The set-up after the headline numbers, so those stay on page 1.
  const setupRows = describeSetup(sheet);
  if (setupRows.length > 0) {
    heading("Set-up behind this result");
    // Summaries only (an interval log's column-by-column list stays on the web sheet, on demand).
    keyValues(setupRows.map(([label, value]) => [label, value]));
  }

  const blocks = channelBlocks(result);
  heading("Evaluation context");
  const context = describeContext(result.context);
  if (context.length > 0) keyValues(context);
  else text("No context values were given.", { continued: false });

  if (result.timeRules && result.timeRules.length > 0) {
    heading("Time rules");
    doc.font("Helvetica").fontSize(8.5).fillColor(colours.soft);
    text(
      `Each order is judged by every rule below (measured statistic against table limit × multiplier); the worst decides its verdict${result.channel ? ` — shown for channel ${result.channel}` : ""}.`,
    );
    doc.moveDown(0.3);
    if (result.timeBasis) keyValues(describeTimeBasis(result.timeBasis));
    const worst = blocks[0];
    for (const rule of timeRuleLines(result.timeRules, worst?.rows ?? result.rows, worst?.aggregates ?? result.aggregates)) {
      const status =
        rule.status === "applied"
          ? `applied over ${rule.valueCount} values${rule.periodCount > 0 ? ` in ${rule.periodCount} period(s)` : ""}; ${rule.failures === 0 ? "nothing over its limit" : `${rule.failures} over its limit`}${rule.note ? `; ${rule.note}` : ""}`
          : `NOT EVALUATED: ${rule.note ?? "no reason given"}`;
      // A result stored before rules said what they measure has only the label; the rule's id is never printed.
      keyValues([[`${rule.label}`, `${rule.statistic ? `${rule.statistic}; ` : ""}limit ${formatMultiplier(rule.multiplier)}; ${status}`]]);
    }
  }

  // Safety caution near the top so it is read with the verdict.
  ensure(50);
  doc.moveDown(0.6);
  const cautionY = doc.y;
  doc.font("Helvetica").fontSize(8.5);
  const cautionH = doc.heightOfString(pdfSafe(safetyText), { width: width - 20 }) + 16;
  doc.rect(margin, cautionY, width, cautionH).fill(colours.cautionLight);
  doc.fillColor(colours.caution).font("Helvetica-Bold").text("Caution", margin + 10, cautionY + 6, { width: width - 20 });
  doc.font("Helvetica").fillColor(colours.ink).text(pdfSafe(safetyText), margin + 10, doc.y + 1, { width: width - 20 });
  doc.y = cautionY + cautionH + 14;

  // --- per channel ---------------------------------------------------------------------------
  if (blocks.length > 1) {
    heading("Channels");
    keyValues(blocks.map((b) => [b.channel, `${verdictLabel(b.verdict)} — band ${b.band.label ?? "none"}`]));
  }
  blocks.forEach((block, index) => {
    heading(`Channel ${block.channel}: ${verdictLabel(block.verdict)}`);
    if (blocks.length > 1) keyValues([["Band", `${block.band.label ?? "none chosen"} — ${block.band.reason}`]]);
    for (const note of block.derived.notes) text(note);
    if (block.aggregates.length > 0) aggregateTable(block);
    if (index === 0 && block.rows.some((r) => r.order >= 2)) spectrumChart(block.rows);
    orderTable(block.rows);
    if (block.rows.some((r) => r.decidedBy !== undefined && tableLimitIfDifferent(r) !== null)) {
      doc.font("Helvetica").fontSize(7.5).fillColor(colours.soft);
      text("% of limit is against the table limit; where a time rule allows more (e.g. ×1.5 = 150 %), the multiplier is in Decided by and the rule's limit in Limit.");
    }
    const reasons = groupReasons(block.rows);
    if (reasons.length > 0) {
      doc.moveDown(0.4);
      doc.font("Helvetica").fontSize(8).fillColor(colours.soft);
      for (const { orders, reason } of reasons) {
        ensure(20);
        text(`Order ${formatOrders(orders)}: ${reason}`);
      }
    }
    for (const c of block.conditions) {
      ensure(20);
      doc.font("Helvetica").fontSize(8).fillColor(colours.soft);
      text(`Condition (${c.verdict === "pass" ? "holds" : "not evaluated"}): ${c.text} — ${conditionReasonText(c)}`);
    }
  });

  if (result.notes.length > 0) {
    heading("Notes");
    doc.font("Helvetica").fontSize(8.5).fillColor(colours.soft);
    for (const note of result.notes) {
      ensure(20);
      text(`• ${note}`);
    }
  }

  heading("Sign-off");
  keyValues([["State", describeSignOff(sheet).label]]);
  if (sheet.reviews.length === 0) text("No review actions yet.");
  for (const r of sheet.reviews) {
    const who = r.actorName ?? "unknown";
    const comment = options.includeComments === false || !r.comment ? "" : ` — "${r.comment}"`;
    keyValues([[formatWhen(r.createdAt), `${reviewActionLabels[r.action] ?? r.action} by ${who}${comment}`]]);
  }

  if (options.studies?.length) addMitigationStudyPages(doc, options.studies, { margin, safe: pdfSafe, formatWhen });

  // --- footer on every page --------------------------------------------------------------------
  const range = doc.bufferedPageRange();
  for (let i = range.start; i < range.start + range.count; i += 1) {
    doc.switchToPage(i);
    const savedBottom = doc.page.margins.bottom;
    doc.page.margins.bottom = 0;
    const y = doc.page.height - margin - 12;
    doc.moveTo(margin, y - 4).lineTo(margin + width, y - 4).lineWidth(0.5).strokeColor(colours.line).stroke();
    doc.font("Helvetica").fontSize(7).fillColor(colours.muted);
    doc.text(
      pdfSafe(`${sheet.capture.title} · ${evaluation.limitSetName}, revision ${evaluation.revisionNumber} · generated ${formatWhen(generatedAt)} · page ${i - range.start + 1} of ${range.count}`),
      margin,
      y,
      { width, lineBreak: false },
    );
    doc.page.margins.bottom = savedBottom;
  }
  doc.end();
  return done;

  // --- pieces --------------------------------------------------------------------------------
  function tableRow(cells: Array<{ text: string; width: number; align?: "left" | "right"; colour?: string; bold?: boolean }>, y: number, size = 8.5) {
    let x = margin;
    for (const c of cells) {
      doc.font(c.bold ? "Helvetica-Bold" : "Helvetica").fontSize(size).fillColor(c.colour ?? colours.ink);
      doc.text(pdfSafe(c.text), x + 3, y, { width: c.width - 6, align: c.align ?? "left", lineBreak: false, ellipsis: true, height: size + 3 });
      x += c.width;
    }
  }

  function aggregateTable(block: Pick<ChannelCompliance, "aggregates">) {
    const widths = [90, 70, 70, 45, 60, 80, 100];
    const head = ["Aggregate", "Measured", "Limit", "Unit", "% of limit", "Verdict", "Decided by"];
    ensure(30);
    doc.moveDown(0.3);
    let y = doc.y;
    tableRow(head.map((h, i) => ({ text: h, width: widths[i] as number, align: i > 0 && i < 5 && i !== 3 ? "right" : "left", colour: colours.muted, bold: true })), y, 7.5);
    y += 12;
    for (const a of block.aggregates) {
      if (y + 12 > bottom()) {
        doc.addPage();
        y = margin;
      }
      const v = verdictColours(a.verdict);
      tableRow(
        [
          { text: a.role === "allowance-condition" ? `${a.name} (allowance)` : a.name, width: widths[0]!, bold: true },
          { text: formatNumber(a.measured), width: widths[1]!, align: "right" },
          { text: formatNumber(a.limit), width: widths[2]!, align: "right" },
          { text: a.unit, width: widths[3]! },
          { text: formatPercentOfLimit(a, { compact: true }), width: widths[4]!, align: "right" },
          { text: verdictLabel(a.verdict), width: widths[5]!, colour: v.fg, bold: a.verdict === "fail" },
          { text: decidedByLabel(a) || "—", width: widths[6]!, colour: colours.soft },
        ],
        y,
      );
      y += 12;
    }
    doc.y = y + 4;
    doc.x = margin;
  }

  function orderTable(rows: ComplianceRow[]) {
    // Table limit: before a time rule's multiplier; Decided by: the rule whose result is shown.
    const widths = [34, 56, 56, 56, 34, 54, 54, 68, 103];
    const head = ["Order", "Measured", "Limit", "Table limit", "Unit", "% of limit", "Margin", "Verdict", "Decided by"];
    const right = new Set([1, 2, 3, 5, 6]);
    const drawHead = (y: number) => {
      doc.rect(margin, y - 2, width, 12).fill(colours.idleLight);
      tableRow(head.map((h, i) => ({ text: h, width: widths[i] as number, align: right.has(i) ? "right" : "left", colour: colours.soft, bold: true })), y, 7.5);
      return y + 13;
    };
    ensure(40);
    doc.moveDown(0.3);
    let y = drawHead(doc.y);
    for (const row of rows) {
      if (y + 11 > bottom()) {
        doc.addPage();
        y = drawHead(margin);
      }
      const v = verdictColours(row.verdict);
      if (row.verdict === "fail") doc.rect(margin, y - 2, width, 11).fill(colours.failLight);
      tableRow(
        [
          { text: `h${row.order}`, width: widths[0]!, bold: true },
          { text: formatNumber(row.measured), width: widths[1]!, align: "right" },
          { text: formatNumber(row.limit), width: widths[2]!, align: "right" },
          { text: formatNumber(tableLimitOf(row)), width: widths[3]!, align: "right", colour: colours.soft },
          { text: row.unit, width: widths[4]! },
          { text: formatPercentOfLimit(row, { compact: true }), width: widths[5]!, align: "right" },
          { text: formatMargin(row.margin), width: widths[6]!, align: "right" },
          { text: verdictLabel(row.verdict), width: widths[7]!, colour: v.fg, bold: row.verdict === "fail" },
          { text: decidedByLabel(row) || "—", width: widths[8]!, colour: colours.soft },
        ],
        y,
        8,
      );
      y += 11;
    }
    doc.y = y + 2;
    doc.x = margin;
  }

  function spectrumChart(allRows: ComplianceRow[]) {
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
    ensure(chartH + 50);
    doc.moveDown(0.4);
    doc.font("Helvetica-Bold").fontSize(8.5).fillColor(colours.ink);
    text(`Spectrum (${unit}): bars measured, marks limit`);
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
      doc.moveTo(left, y).lineTo(left + plotW, y).lineWidth(0.3).strokeColor(colours.line).stroke();
      doc.fillColor(colours.muted).text(formatNumber(v), margin, y - 3, { width: 34, align: "right", lineBreak: false });
    }
    const first = rows[0]!.order;
    const last = rows[rows.length - 1]!.order;
    const slot = plotW / (last - first + 1);
    for (const r of rows) {
      const cx = left + (r.order - first + 0.5) * slot;
      const m = measured(r);
      if (m !== null && m > 0) {
        const h = base - yOf(m);
        doc.rect(cx - slot * 0.32, base - h, slot * 0.64, h).fill(r.verdict === "fail" ? colours.fail : colours.soft);
      }
      const l = limit(r);
      if (l !== null) {
        const y = yOf(l);
        doc.moveTo(cx - slot * 0.48, y).lineTo(cx + slot * 0.48, y).lineWidth(1.4).strokeColor(colours.copper).stroke();
      }
      if (r.order === first || r.order % 5 === 0) {
        doc.fillColor(colours.muted).text(String(r.order), cx - 10, base + 3, { width: 20, align: "center", lineBreak: false });
      }
    }
    doc.moveTo(left, base).lineTo(left + plotW, base).lineWidth(0.6).strokeColor(colours.soft).stroke();
    doc.y = base + 16;
    doc.x = margin;
    doc.font("Helvetica").fontSize(7).fillColor(colours.muted);
    text("Harmonic order. Red bars exceed their limit; copper marks are the limits; values above the top of the axis are clipped.");
  }
}

/** 1, 2, 2.5 or 5 × 10^k at or above x, for chart axes. */
function niceCeiling(x: number): number {
  const power = 10 ** Math.floor(Math.log10(x));
  for (const step of [1, 2, 2.5, 5, 10]) if (step * power >= x) return step * power;
  return 10 * power;
}
