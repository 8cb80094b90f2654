import type { PredictedHarmonic, WhatIfResult } from "@/lib/mitigation/types";
import { FAMILY_LABELS } from "@/lib/frontends/family-labels";
import { describeFilterReport } from "@/lib/mitigation/describe-filter-report";
import { describeMitigation } from "@/lib/mitigation/describe-mitigation";
import { formatNumber, formatWhen, verdictLabel } from "../format";
import { predictionLimits } from "../prediction-limits";
import { drawTable, type TableColumn } from "./draw-table";
import { pdfColours } from "./pdf-colours";
import { pdfSafe } from "./pdf-safe";
import type { PdfWriter } from "./pdf-writer";

/** A saved study as the report prints it (a row of listMitigationStudies, structurally). */
export interface StudyForReport {
  title: string;
  modelVersion: string;
  result: WhatIfResult;
  createdAt: Date;
  authorName: string | null;
  /** When the evaluation the study started from was made (null: saved before studies recorded it). */
  evaluationCreatedAt?: Date | null;
}

/** At most this many orders per channel: the failing ones and those of at least 2 % of the fundamental. */
const MAX_ORDERS = 16;

/**
 * One "Mitigation study — prediction" page per study chosen for the report: the mitigations, the
 * front end each channel resembles, measured → predicted per order with the predicted verdicts
 * (drawTable, as the sheet's own tables), THD/TDD, filter reports, warnings, assumptions and the
 * caution. Marked as a prediction at the top. O(studies × channels × orders).
 *
 * @example addMitigationStudies(w, studies)
 */
export function addMitigationStudies(w: PdfWriter, studies: readonly StudyForReport[]): void {
  const { doc, margin, width } = w;
  for (const study of studies) {
    const r = study.result;
    w.newPage();
    doc.rect(margin, doc.y, width, 26).fill(pdfColours.cautionLight);
    doc.font("Helvetica-Bold").fontSize(13).fillColor(pdfColours.caution);
    doc.text(pdfSafe("Mitigation study — prediction"), margin + 8, doc.y + 7, { width: width - 16 });
    doc.y = doc.y + 12;
    doc.font("Helvetica-Bold").fontSize(11).fillColor(pdfColours.ink);
    w.text(study.title);
    doc.font("Helvetica").fontSize(9).fillColor(pdfColours.muted);
    w.text(`Saved by ${study.authorName ?? "unknown"}, ${formatWhen(study.createdAt)} · model ${study.modelVersion}`);
    if (study.evaluationCreatedAt) w.text(`Starts from the evaluation of ${formatWhen(study.evaluationCreatedAt)} — the one this report shows.`);
    doc.moveDown(0.4).fillColor(pdfColours.ink);
    w.text(`Mitigations: ${r.mitigations.map(describeMitigation).join(" + ")}`);
    if (r.compliance) {
      doc.font("Helvetica-Bold");
      w.text(`Predicted verdict: ${verdictLabel(r.compliance.verdict).toUpperCase()} — ${r.compliance.limitSet.name}, revision ${r.compliance.revision.number}, in the context of that evaluation`);
      doc.font("Helvetica");
    }
    for (const ch of r.channels) {
      w.ensure(60);
      doc.moveDown(0.5).font("Helvetica-Bold").fontSize(10).fillColor(pdfColours.ink);
      w.text(ch.name);
      doc.font("Helvetica").fontSize(8.5).fillColor(pdfColours.ink);
      w.text(`Resembles: ${FAMILY_LABELS[ch.frontEnd.family]} (fit error ${ch.frontEnd.fitErrorPercent.toFixed(1)} % of fundamental) — ${ch.frontEnd.description}`);
      w.text(`THD ${ch.measuredThdPercent.toFixed(1)} % → ${ch.thdPercent.toFixed(1)} %${ch.tddPercent !== null && ch.measuredTddPercent !== null ? `; TDD ${ch.measuredTddPercent.toFixed(1)} % → ${ch.tddPercent.toFixed(1)} %` : ""}`);
      for (const f of ch.filters) w.text(describeFilterReport(f));
      const judged = r.compliance?.channels.find((c) => c.channel === ch.name);
      const rows = judged?.rows ?? [];
      const byOrder = new Map(rows.map((x) => [x.order, x]));
      const shown = ch.harmonics.filter((h) => h.order >= 2 && (byOrder.get(h.order)?.verdict === "fail" || (h.measuredRms ?? 0) >= 0.02 * ch.fundamentalA)).slice(0, MAX_ORDERS);
      if (shown.length === 0) continue;
      // One unit per column: the table limit in amperes (with the base the evaluator used) and, where the
      // table states it in another unit (%IL, %Iref, %I1), that unit in a column of its own.
      const limits = predictionLimits(rows, { fundamentalA: ch.fundamentalA, irefA: judged?.derived.irefA, context: r.compliance?.context });
      const inA = limits.unit === "A";
      const columns: Array<TableColumn<PredictedHarmonic>> = [
        { label: "Order", width: inA ? 50 : 45, cell: (h) => String(h.order) },
        { label: "Measured (A)", width: inA ? 90 : 80, align: "right", cell: (h) => formatNumber(h.measuredRms, 3) },
        { label: "Predicted (A)", width: inA ? 90 : 80, align: "right", cell: (h) => formatNumber(h.rms, 3) },
        { label: "Table limit (A)", width: inA ? 90 : 80, align: "right", cell: (h) => formatNumber(limits.tableLimitA(byOrder.get(h.order)), 3) },
        ...(inA ? [] : [{ label: `Table limit (${limits.unit})`, width: 80, align: "right" as const, cell: (h: PredictedHarmonic) => formatNumber(limits.tableLimit(byOrder.get(h.order)), 3) }]),
        { label: "Predicted verdict", width: inA ? 120 : 110, cell: (h) => verdictLabel(byOrder.get(h.order)?.verdict ?? "—") },
      ];
      drawTable(w, columns, shown, {
        keepTogether: 12 * (shown.length + 1),
        head: { size: 8.5, colour: pdfColours.ink, height: 12 },
        body: { size: 8.5, colour: pdfColours.ink, height: 12 },
        rule: pdfColours.line,
        gapAfter: 0,
      });
    }
    doc.moveDown(0.6).font("Helvetica").fontSize(8.5).fillColor(pdfColours.caution);
    for (const warning of r.warnings) {
      w.ensure(14);
      w.text(`Warning: ${warning}`);
    }
    doc.fillColor(pdfColours.muted);
    for (const assumption of r.assumptions) {
      w.ensure(14);
      w.text(`Assumption: ${assumption}`);
    }
    w.ensure(30);
    doc.moveDown(0.4).font("Helvetica-Bold").fillColor(pdfColours.caution);
    w.text(r.caution);
    doc.font("Helvetica").fillColor(pdfColours.ink);
  }
}
