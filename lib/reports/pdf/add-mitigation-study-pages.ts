import { FAMILY_LABELS } from "@/lib/frontends/family-labels";
import { describeMitigation } from "@/lib/mitigation/describe-mitigation";
import type { WhatIfResult } from "@/lib/mitigation/types";
import { formatWhen } from "../format";
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
}

/**
 * One "Mitigation study — prediction" page per study chosen for the report: the mitigations, the
 * front end each channel resembles, measured → predicted per order with the predicted verdicts,
 * THD/TDD, filter reports, warnings, assumptions and the caution. Marked as a prediction at the top.
 * O(studies × orders).
 *
 * @example addMitigationStudyPages(w, studies)
 */
export function addMitigationStudyPages(w: PdfWriter, studies: readonly StudyForReport[]): void {
  const { doc, margin, width } = w;
  const { ink, muted, caution, cautionLight } = pdfColours;
  for (const study of studies) {
    const r = study.result;
    w.newPage();
    doc.rect(margin, doc.y, width, 26).fill(cautionLight);
    doc.font("Helvetica-Bold").fontSize(13).fillColor(caution).text(pdfSafe("Mitigation study — prediction"), margin + 8, doc.y + 7, { width: width - 16 });
    doc.y = doc.y + 12;
    doc.font("Helvetica-Bold").fontSize(11).fillColor(ink);
    w.text(study.title);
    doc.font("Helvetica").fontSize(9).fillColor(muted);
    w.text(`Saved by ${study.authorName ?? "unknown"}, ${formatWhen(study.createdAt)} · model ${study.modelVersion}`);
    doc.moveDown(0.4).fillColor(ink);
    w.text(`Mitigations: ${r.mitigations.map(describeMitigation).join(" + ")}`);
    if (r.compliance) {
      doc.font("Helvetica-Bold");
      w.text(`Predicted verdict: ${r.compliance.verdict.toUpperCase()} — ${r.compliance.limitSet.name} (${r.compliance.limitSet.key} revision ${r.compliance.revision.number}), the sheet's context`);
      doc.font("Helvetica");
    }
    for (const ch of r.channels) {
      w.ensure(60);
      doc.moveDown(0.5).font("Helvetica-Bold").fontSize(10).fillColor(ink);
      w.text(ch.name);
      doc.font("Helvetica").fontSize(8.5).fillColor(ink);
      w.text(`Resembles: ${FAMILY_LABELS[ch.frontEnd.family]} (fit error ${ch.frontEnd.fitErrorPercent.toFixed(1)} % of fundamental) — ${ch.frontEnd.description}`);
      w.text(`THD ${ch.measuredThdPercent.toFixed(1)} % -> ${ch.thdPercent.toFixed(1)} %${ch.tddPercent !== null && ch.measuredTddPercent !== null ? `; TDD ${ch.measuredTddPercent.toFixed(1)} % -> ${ch.tddPercent.toFixed(1)} %` : ""}`);
      for (const f of ch.filters) {
        if (f.kind === "passive-filter" && f.capacitorDuty)
          w.text(
            `Filter: parallel resonance near order ${f.parallelResonanceOrder?.toFixed(2)}; capacitor duty rms V ${f.capacitorDuty.rmsVoltagePercent.toFixed(0)} %, peak V ${f.capacitorDuty.peakVoltagePercent.toFixed(0)} %, rms I ${f.capacitorDuty.rmsCurrentPercent.toFixed(0)} %, kvar ${f.capacitorDuty.kvarPercent.toFixed(0)} % of rating`,
          );
        if (f.kind === "active-filter") w.text(`Active filter: ${f.ratingUsedA?.toFixed(1)} A used (${f.ratingUsedPercent?.toFixed(0)} % of rating)`);
      }
      const judged = r.compliance?.channels.find((c) => c.channel === ch.name)?.rows ?? [];
      const byOrder = new Map(judged.map((x) => [x.order, x]));
      const shown = ch.harmonics.filter((h) => h.order >= 2 && (byOrder.get(h.order)?.verdict === "fail" || (h.measuredRms ?? 0) >= 0.02 * ch.fundamentalA)).slice(0, 16);
      if (shown.length === 0) continue;
      const columns: Array<TableColumn<(typeof shown)[number]>> = [
        { label: "Order", width: 50, cell: (h) => String(h.order) },
        { label: "Measured, A", width: 90, align: "right", cell: (h) => (h.measuredRms === null ? "—" : h.measuredRms.toPrecision(3)) },
        { label: "Predicted, A", width: 90, align: "right", cell: (h) => (h.rms === null ? "—" : h.rms.toPrecision(3)) },
        { label: `Limit${judged[0] ? ` (${judged[0].unit})` : ""}`, width: 90, align: "right", cell: (h) => byOrder.get(h.order)?.limit?.toPrecision(3) ?? "—" },
        { label: "Predicted verdict", width: 120, cell: (h) => byOrder.get(h.order)?.verdict ?? "—" },
      ];
      drawTable(w, columns, shown, {
        keepTogether: 14 * (shown.length + 1),
        head: { size: 8.5, colour: ink, height: 12 },
        body: { size: 8.5, colour: ink, height: 12 },
        rule: pdfColours.line,
        gapAfter: 0,
      });
    }
    doc.moveDown(0.6).font("Helvetica").fontSize(8.5).fillColor(caution);
    for (const warning of r.warnings) {
      w.ensure(14);
      w.text(`Warning: ${warning}`);
    }
    doc.fillColor(muted);
    for (const a of r.assumptions) {
      w.ensure(14);
      w.text(`Assumption: ${a}`);
    }
    w.ensure(30);
    doc.moveDown(0.4).font("Helvetica-Bold").fillColor(caution);
    w.text(r.caution);
    doc.font("Helvetica").fillColor(ink);
  }
}
