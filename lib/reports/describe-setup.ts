// The set-up behind a result, worded once for the sheet page, the share page and the PDF.
import type { AnalysisResult } from "@/lib/analysis/types";
import { formatNumber } from "./format";

export interface SetupInput {
  analysis?: {
    result: Pick<AnalysisResult, "fundamentalHz" | "sampleIntervalS"> & { channels: Pick<AnalysisResult["channels"][number], "name" | "quantity" | "phase">[] };
    setup?: Record<string, unknown> | null;
    fileSha256?: string | null;
  } | null;
}

interface ChannelSetup {
  quantity?: string;
  scale?: number;
  phase?: string | null;
  ignore?: boolean;
}

/**
 * The set-up behind a result as label/value pairs: channel map with scales, sample interval,
 * fundamental and the SHA-256 of the file analysed. Empty when the sheet has no analysis.
 *
 * @example describeSetup({ analysis: null }) // []
 */
export function describeSetup(sheet: SetupInput): [string, string][] {
  const a = sheet.analysis;
  if (!a) return [];
  const mapping = (a.setup?.mapping ?? {}) as { channels?: Record<string, ChannelSetup>; intervalMapping?: { columns?: { column: string; channel: string; kind: string; order?: number; unit: string }[] } };
  const rows: [string, string][] = [];
  if (mapping.intervalMapping?.columns) {
    rows.push([
      "Column map",
      mapping.intervalMapping.columns.map((c) => `${c.column}: ${c.channel} ${c.kind === "order" ? `h${c.order ?? "?"}` : c.kind} (${c.unit})`).join("; "),
    ]);
  } else {
    const channels = mapping.channels ?? {};
    const described = a.result.channels.map((c) => {
      const set = channels[c.name];
      const scale = set?.scale ?? 1;
      return `${c.name}: ${c.quantity}${c.phase ? ` phase ${c.phase}` : ""}, scale × ${formatNumber(scale)}`;
    });
    const ignored = Object.entries(channels).filter(([, v]) => v.ignore).map(([k]) => `${k} (left out)`);
    rows.push(["Channel map and scales", [...described, ...ignored].join("; ") || "—"]);
    rows.push(["Sample interval", `${formatNumber(a.result.sampleIntervalS * 1e6)} µs`]);
  }
  rows.push(["Fundamental", `${formatNumber(a.result.fundamentalHz)} Hz`]);
  rows.push(["File SHA-256", a.fileSha256 ?? "not recorded (uploaded before hashes were kept)"]);
  return rows;
}
