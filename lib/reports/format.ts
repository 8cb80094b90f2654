// Number, verdict and context wording shared by the sheet page, the share page, the PDF and the CSV,
// so every rendering of a sheet says the same thing in the same words.
import type { EvaluationContext } from "@/lib/compliance/model";
import { formatNumber } from "@/lib/compliance/format-number";
import type { AggregateVerdict, ComplianceRow, OverallVerdict, RowVerdict } from "@/lib/compliance/result";
import { causeText, formatUtc, thresholdText } from "./result-wording";

export type AnyVerdict = RowVerdict | AggregateVerdict | OverallVerdict;

export const verdictLabels: Record<AnyVerdict, string> = {
  pass: "Pass",
  fail: "Fail",
  "below-threshold": "Below threshold",
  "not-evaluated": "Not evaluated",
  incomplete: "Incomplete",
};

/** Label of a verdict string from the database (unknown values are shown as they are). */
export function verdictLabel(verdict: string): string {
  return (verdictLabels as Record<string, string>)[verdict] ?? verdict;
}

export const reviewStateLabels: Record<string, string> = {
  draft: "Draft — not yet submitted",
  in_review: "In review",
  approved: "Approved",
  sent_back: "Sent back",
};

/** A capture's processing status where statuses are listed or filtered. */
export const captureStatusLabels: Record<string, string> = {
  uploading: "Uploading",
  uploaded: "Needs mapping",
  queued: "Queued",
  running: "Analysing",
  done: "Analysed",
  failed: "Failed",
};

/** The same status as the capture's own page says it, as a sentence. */
export const captureStatusSentences: Record<string, string> = {
  uploading: "Waiting for the file to arrive",
  uploaded: "Uploaded — the channels need mapping before analysis",
  queued: "Queued for analysis",
  running: "Analysing",
  done: "Analysed",
  failed: "The analysis failed",
};

export const reviewActionLabels: Record<string, string> = {
  submitted: "Submitted for review",
  approved: "Approved",
  sent_back: "Sent back",
  comment: "Comment",
};

/** The one number formatter (lib/compliance/format-number.ts), under the name the renderers use. */
export { formatNumber };

/**
 * A text that starts a sentence on its own, with its first letter in upper case: the engine's
 * messages start in lower case (they also follow "error: " on the command line and a colon
 * on the set-up page). O(length).
 *
 * @example sentenceStart("no sample interval: the file has no time column") // "No sample interval: the file has no time column"
 */
export function sentenceStart(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}

/** Why an analysis failed, shown on its own under "Why it failed": the stored reason as a sentence, or that none was recorded. */
export function failureReasonText(reason: string | null | undefined): string {
  return reason ? sentenceStart(reason) : "No reason was recorded.";
}

/** Percent of limit with one decimal, "—" when absent. */
export function formatPercent(x: number | null | undefined): string {
  return x === null || x === undefined || !Number.isFinite(x) ? "—" : `${x.toFixed(1)} %`;
}

/** Margin with an explicit sign: positive is headroom, negative is the excess. */
export function formatMargin(x: number | null | undefined): string {
  if (x === null || x === undefined || !Number.isFinite(x)) return "—";
  return x > 0 ? `+${formatNumber(x)}` : formatNumber(x);
}

/** UTC date and time to the minute, the same on the server, in the browser and in the PDF. */
export function formatWhen(d: Date | string | null | undefined): string {
  return d ? formatUtc(new Date(d).getTime()) : "—";
}

const phaseConfigLabels: Record<string, string> = {
  "single-phase": "single-phase",
  "balanced-three-phase": "balanced three-phase",
  other: "other",
};

/**
 * The context values an evaluation used, as label/value pairs in a fixed order, for headers and
 * history lists. Absent values are left out.
 *
 * @example describeContext({ iscA: 8200, ilA: 260 }) // [["Isc", "8200 A"], ["IL", "260 A"], ["Isc/IL", "31.5"]]
 */
export function describeContext(context: EvaluationContext | Record<string, unknown>): Array<[string, string]> {
  const c = context as EvaluationContext;
  const out: Array<[string, string]> = [];
  if (c.iscA !== undefined) out.push(["Isc", `${formatNumber(c.iscA)} A`]);
  if (c.ilA !== undefined) out.push(["IL", `${formatNumber(c.ilA)} A`]);
  if (c.iscA !== undefined && c.ilA !== undefined) out.push(["Isc/IL", (c.iscA / c.ilA).toFixed(1)]);
  if (c.irefA !== undefined) out.push(["Iref", `${formatNumber(c.irefA)} A`]);
  if (c.rsce !== undefined) out.push(["Rsce", formatNumber(c.rsce)]);
  if (c.ratedPowerW !== undefined) out.push(["Rated power", `${formatNumber(c.ratedPowerW)} W`]);
  if (c.lambda !== undefined) out.push(["Power factor (lambda)", formatNumber(c.lambda)]);
  if (c.busVoltageV !== undefined) {
    // Which voltage chose a bus-voltage band: one given as such, or the system's nominal voltage standing in for it.
    const from = c.busVoltageSource === "system-nominal" ? " (the system's nominal voltage; no bus voltage given)" : "";
    out.push(["Bus voltage", `${formatNumber(c.busVoltageV)} V${from}`]);
  }
  // The measured channels' own nominal (line-to-neutral on a three-phase set), not the system's: say so beside the bus voltage.
  if (c.nominalVoltageV !== undefined) out.push(["Nominal voltage of the channels", `${formatNumber(c.nominalVoltageV)} V`]);
  if (c.phaseConfig !== undefined) out.push(["Phase configuration", phaseConfigLabels[c.phaseConfig] ?? c.phaseConfig]);
  if (c.isGenerator) out.push(["Generator", "yes"]);
  if (c.interpolate === false) out.push(["Rsce interpolation", "off"]);
  // Conditions are named by their text under the band (the ids are internal): here, how many the engineer confirmed.
  if (c.assertedConditions && c.assertedConditions.length > 0) out.push(["Band conditions confirmed by the engineer", String(c.assertedConditions.length)]);
  return out;
}

/** One-line context summary, e.g. "Isc 8200 A · IL 260 A · Isc/IL 31.5"; "no context values" when empty. */
export function summariseContext(context: EvaluationContext | Record<string, unknown>): string {
  const parts = describeContext(context).map(([k, v]) => `${k} ${v}`);
  return parts.length > 0 ? parts.join(" · ") : "no context values";
}

/**
 * Rows that are not a plain pass/fail, grouped by their reason so ten "above Nyquist" rows read as
 * one line: [[orders], reason]. Below-threshold rows group by their threshold (the sentence
 * without the row's own value); other rows by their cause, or by the reason stored with results
 * that predate causes.
 */
export function groupReasons(rows: ComplianceRow[]): Array<{ orders: number[]; reason: string }> {
  const groups = new Map<string, number[]>();
  for (const row of rows) {
    if (!row.reason || row.verdict === "pass") continue;
    const reason = row.threshold ? thresholdText(row.threshold) : row.cause && !row.rowRules ? causeText(row.cause) : row.reason;
    const list = groups.get(reason) ?? [];
    list.push(row.order);
    groups.set(reason, list);
  }
  return [...groups.entries()].map(([reason, orders]) => ({ orders, reason }));
}

/** "3, 5, 7–11" style list of orders (consecutive odd or all orders collapse into ranges). */
export function formatOrders(orders: number[]): string {
  const sorted = [...orders].sort((a, b) => a - b);
  const parts: string[] = [];
  let i = 0;
  while (i < sorted.length) {
    let j = i;
    const step = sorted[i + 1] !== undefined ? (sorted[i + 1] as number) - (sorted[i] as number) : 0;
    if (step === 1 || step === 2) {
      while (j + 1 < sorted.length && (sorted[j + 1] as number) - (sorted[j] as number) === step) j += 1;
    }
    if (j - i >= 2) {
      parts.push(`${sorted[i]}–${sorted[j]}${step === 2 ? ((sorted[i] as number) % 2 === 1 ? " odd" : " even") : ""}`);
      i = j + 1;
    } else {
      parts.push(String(sorted[i]));
      i += 1;
    }
  }
  return parts.join(", ");
}
