import type { ComplianceResult } from "@/lib/compliance/result";
import { formatMultiplier } from "../result-wording";
import type { ChannelBlock } from "../sheet-report";
import { describeTimeBasis, timeRuleLines } from "../time-rules";
import { pdfColours } from "./pdf-colours";
import type { PdfWriter } from "./pdf-writer";

/**
 * The "Time rules" section: how orders are judged, the record's time basis, and per rule its
 * statistic, limit multiplier and whether it was applied (over how many values, what failed) or
 * why not — for the worst channel. Nothing when the limit set has no time rules. O(rules × orders).
 *
 * @example addTimeRules(w, result, channelBlocks(result)[0])
 */
export function addTimeRules(w: PdfWriter, result: ComplianceResult, worst: ChannelBlock | undefined): void {
  if (!result.timeRules || result.timeRules.length === 0) return;
  w.heading("Time rules");
  w.doc.font("Helvetica").fontSize(8.5).fillColor(pdfColours.soft);
  w.text(
    `Each order is judged by every rule below (measured statistic against table limit × multiplier); the worst decides its verdict${result.channel ? ` — shown for channel ${result.channel}` : ""}.`,
  );
  w.doc.moveDown(0.3);
  if (result.timeBasis) w.keyValues(describeTimeBasis(result.timeBasis));
  for (const rule of timeRuleLines(result.timeRules, worst?.rows ?? result.rows, worst?.aggregates ?? result.aggregates)) {
    const status =
      rule.status === "applied"
        ? `applied over ${rule.valueCount} values${rule.periodCount > 0 ? ` in ${rule.periodCount} period(s)` : ""}; ${rule.failures === 0 ? "nothing over its limit" : `${rule.failures} over its limit`}${rule.note ? `; ${rule.note}` : ""}`
        : `NOT EVALUATED: ${rule.note ?? "no reason given"}`;
    // A result stored before rules said what they measure has only the label; the rule's id is never printed.
    w.keyValues([[`${rule.label}`, `${rule.statistic ? `${rule.statistic}; ` : ""}limit ${formatMultiplier(rule.multiplier)}; ${status}`]]);
  }
}
