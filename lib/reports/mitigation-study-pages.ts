import "server-only";
import type PDFDocument from "pdfkit";
import { FAMILY_LABELS } from "@/lib/frontends/family-labels";
import { describeMitigation } from "@/lib/mitigation/describe-mitigation";
import type { WhatIfResult } from "@/lib/mitigation/types";
import { verdictLabel } from "./format";
import { unitScale } from "./spectrum-bars";
import { tableLimitOf } from "./time-rules";

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

const ink = "#1d2a3a";
const muted = "#6b788a";
const caution = "#8a6100";
const cautionLight = "#f8ecc9";
const line = "#ddd6ca";

/**
 * One "Mitigation study — prediction" page per study chosen for the report: the mitigations, the
 * front end each channel resembles, measured → predicted per order with the predicted verdicts,
 * THD/TDD, filter reports, warnings, assumptions and the caution. Marked as a prediction at the top.
 *
 * @param safe maps text to the PDF's standard-font character set
 * @example addMitigationStudyPages(doc, studies, { margin: 40, safe: (s) => s, formatWhen: (d) => d.toISOString() })
 */
export function addMitigationStudyPages(
  doc: InstanceType<typeof PDFDocument>,
  studies: readonly StudyForReport[],
  { margin, safe, formatWhen }: { margin: number; safe: (text: string) => string; formatWhen: (d: Date) => string },
): void {
  const width = doc.page.width - 2 * margin;
  const bottom = () => doc.page.height - margin - 40;
  const text = (s: string, opts: PDFKit.Mixins.TextOptions = {}) => doc.text(safe(s), margin, doc.y, { width, ...opts });
  const ensure = (h: number) => {
    if (doc.y + h > bottom()) {
      doc.addPage();
      doc.y = margin;
    }
  };
  for (const study of studies) {
    const r = study.result;
    doc.addPage();
    doc.y = margin;
    doc.rect(margin, doc.y, width, 26).fill(cautionLight);
    doc.font("Helvetica-Bold").fontSize(13).fillColor(caution).text(safe("Mitigation study — prediction"), margin + 8, doc.y + 7, { width: width - 16 });
    doc.y = doc.y + 12;
    doc.font("Helvetica-Bold").fontSize(11).fillColor(ink);
    text(study.title);
    doc.font("Helvetica").fontSize(9).fillColor(muted);
    text(`Saved by ${study.authorName ?? "unknown"}, ${formatWhen(study.createdAt)} · model ${study.modelVersion}`);
    if (study.evaluationCreatedAt) text(`Starts from the evaluation of ${formatWhen(study.evaluationCreatedAt)} — the one this report shows.`);
    doc.moveDown(0.4).fillColor(ink);
    text(`Mitigations: ${r.mitigations.map(describeMitigation).join(" + ")}`);
    if (r.compliance) {
      doc.font("Helvetica-Bold");
      text(`Predicted verdict: ${r.compliance.verdict.toUpperCase()} — ${r.compliance.limitSet.name}, revision ${r.compliance.revision.number}, in the context of that evaluation`);
      doc.font("Helvetica");
    }
    for (const ch of r.channels) {
      ensure(60);
      doc.moveDown(0.5).font("Helvetica-Bold").fontSize(10).fillColor(ink);
      text(ch.name);
      doc.font("Helvetica").fontSize(8.5).fillColor(ink);
      text(`Resembles: ${FAMILY_LABELS[ch.frontEnd.family]} (fit error ${ch.frontEnd.fitErrorPercent.toFixed(1)} % of fundamental) — ${ch.frontEnd.description}`);
      text(`THD ${ch.measuredThdPercent.toFixed(1)} % -> ${ch.thdPercent.toFixed(1)} %${ch.tddPercent !== null && ch.measuredTddPercent !== null ? `; TDD ${ch.measuredTddPercent.toFixed(1)} % -> ${ch.tddPercent.toFixed(1)} %` : ""}`);
      for (const f of ch.filters) {
        if (f.kind === "passive-filter" && f.capacitorDuty)
          text(
            `Filter: parallel resonance near order ${f.parallelResonanceOrder?.toFixed(2)}; capacitor duty rms V ${f.capacitorDuty.rmsVoltagePercent.toFixed(0)} %, peak V ${f.capacitorDuty.peakVoltagePercent.toFixed(0)} %, rms I ${f.capacitorDuty.rmsCurrentPercent.toFixed(0)} %, kvar ${f.capacitorDuty.kvarPercent.toFixed(0)} % of rating`,
          );
        if (f.kind === "active-filter") text(`Active filter: ${f.ratingUsedA?.toFixed(1)} A used (${f.ratingUsedPercent?.toFixed(0)} % of rating)`);
      }
      const judged = r.compliance?.channels.find((c) => c.channel === ch.name);
      const rows = judged?.rows ?? [];
      // One unit per column: the table limit in amperes (with the base the evaluator used) and, where the
      // table states it in another unit (%IL, %Iref, %I1), that unit in a column of its own.
      const rowUnit = rows.find((x) => x.limit !== null)?.unit ?? "A";
      const context = r.compliance?.context;
      const perRowUnitA = unitScale(rowUnit, { fundamentalRms: ch.fundamentalA, ilA: context?.ilA, irefA: judged?.derived.irefA ?? context?.irefA, nominalVoltageV: context?.nominalVoltageV });
      const num = (v: number | null | undefined) => (v == null ? "—" : v.toPrecision(3));
      const byOrder = new Map(rows.map((x) => [x.order, x]));
      const shown = ch.harmonics.filter((h) => h.order >= 2 && (byOrder.get(h.order)?.verdict === "fail" || (h.measuredRms ?? 0) >= 0.02 * ch.fundamentalA)).slice(0, 16);
      if (shown.length > 0) {
        ensure(14 * (shown.length + 1));
        const widths = rowUnit === "A" ? [50, 90, 90, 90, 120] : [45, 80, 80, 80, 80, 110];
        const last = widths.length - 1;
        const row = (cells: string[], bold = false) => {
          const y = doc.y;
          let x = margin;
          doc.font(bold ? "Helvetica-Bold" : "Helvetica").fontSize(8.5).fillColor(ink);
          cells.forEach((c, k) => {
            doc.text(safe(c), x + 3, y, { width: widths[k]! - 6, lineBreak: false, align: k === 0 || k === last ? "left" : "right" });
            x += widths[k]!;
          });
          doc.y = y + 12;
          doc.moveTo(margin, doc.y - 1).lineTo(margin + widths.reduce((a, b) => a + b, 0), doc.y - 1).lineWidth(0.3).strokeColor(line).stroke();
        };
        doc.moveDown(0.3);
        row(["Order", "Measured (A)", "Predicted (A)", "Table limit (A)", ...(rowUnit === "A" ? [] : [`Table limit (${rowUnit})`]), "Predicted verdict"], true);
        for (const h of shown) {
          const p = byOrder.get(h.order);
          const table = p ? tableLimitOf(p) : null;
          const limitA = table === null || perRowUnitA === null ? null : table * perRowUnitA;
          row([String(h.order), num(h.measuredRms), num(h.rms), num(limitA), ...(rowUnit === "A" ? [] : [num(table)]), p ? verdictLabel(p.verdict) : "—"]);
        }
      }
    }
    doc.moveDown(0.6).font("Helvetica").fontSize(8.5).fillColor(caution);
    for (const w of r.warnings) {
      ensure(14);
      text(`Warning: ${w}`);
    }
    doc.fillColor(muted);
    for (const a of r.assumptions) {
      ensure(14);
      text(`Assumption: ${a}`);
    }
    ensure(30);
    doc.moveDown(0.4).font("Helvetica-Bold").fillColor(caution);
    text(r.caution);
    doc.font("Helvetica").fillColor(ink);
  }
}
