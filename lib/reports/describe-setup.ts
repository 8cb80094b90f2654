// The set-up behind a result, worded once for the sheet page, the share page and the PDF.
import type { AnalysisResult } from "@/lib/analysis/types";
import { formatNumber } from "./format";
import { describeOrders } from "./result-wording";

export interface SetupInput {
  analysis?: {
    result: Pick<AnalysisResult, "fundamentalHz" | "sampleIntervalS"> & { channels: Pick<AnalysisResult["channels"][number], "name" | "quantity" | "phase">[] };
    setup?: Record<string, unknown> | null;
    fileSha256?: string | null;
  } | null;
}

/** One line of the set-up: label, value, and (where the value is a summary) the full list behind it, for "details on demand". */
export type SetupLine = [label: string, value: string, details?: string[]];

interface IntervalColumnSetup {
  column: string;
  channel: string;
  quantity?: string;
  kind: string;
  order?: number;
  unit: string;
  scale?: number;
}

/**
 * An interval log's column map summarised: per channel what its columns hold (fundamental, which
 * orders, THD, r.m.s.), in its units and with any scale — the full column-by-column list as details.
 */
function intervalColumnLines(map: { timestamp?: { column?: string; timeColumn?: string }; columns: IntervalColumnSetup[] }, unmapped: string[] | undefined): SetupLine[] {
  const byChannel = new Map<string, IntervalColumnSetup[]>();
  for (const c of map.columns) byChannel.set(c.channel, [...(byChannel.get(c.channel) ?? []), c]);
  const channels = [...byChannel].map(([name, cols]) => {
    const orders = cols.filter((c) => c.kind === "order" && c.order !== undefined && c.order > 1).map((c) => c.order!).sort((x, y) => x - y);
    const parts = [
      ...(cols.some((c) => c.kind === "order" && c.order === 1) ? ["fundamental"] : []),
      ...(orders.length > 0 ? [`${orders.length === 1 ? "order" : "orders"} ${describeOrders(orders)}`] : []),
      ...(cols.some((c) => c.kind === "thd") ? ["THD"] : []),
      ...(cols.some((c) => c.kind === "rms") ? ["r.m.s."] : []),
    ];
    const quantity = cols[0]?.quantity ? `${cols[0].quantity}, ` : "";
    // THD is always in %; the units that matter are those of the orders and r.m.s. values.
    const units = [...new Set(cols.filter((c) => c.kind !== "thd").map((c) => c.unit))].join(" and ") || "%";
    const scales = [...new Set(cols.map((c) => c.scale ?? 1))].filter((k) => k !== 1);
    const scale = scales.length > 0 ? `, scale × ${scales.map((k) => formatNumber(k)).join("/")}` : "";
    return `${name} (${quantity}${units}${scale}): ${parts.join(", ")}`;
  });
  const time = map.timestamp?.column ? `; time from “${map.timestamp.column}”${map.timestamp.timeColumn ? ` and “${map.timestamp.timeColumn}”` : ""}` : "";
  const lines: SetupLine[] = [
    [
      "Column map",
      `${map.columns.length} columns on ${channels.length} channel${channels.length === 1 ? "" : "s"}${time} — ${channels.join("; ")}`,
      map.columns.map((c) => `${c.column} → ${c.channel} ${c.kind === "order" ? `h${c.order ?? "?"}` : c.kind === "rms" ? "r.m.s." : "THD"} (${c.unit}${c.scale !== undefined && c.scale !== 1 ? `, × ${formatNumber(c.scale)}` : ""})`),
    ],
  ];
  if (unmapped) lines.push(["Columns not used", unmapped.length === 0 ? "none — every column of the file is mapped" : unmapped.join(", ")]);
  return lines;
}

interface ChannelSetup {
  quantity?: string;
  scale?: number;
  phase?: string | null;
  ignore?: boolean;
}

/**
 * The set-up behind a result as label/value lines: channel map with scales (an interval log's column
 * map summarised per channel, the full list as the line's details, and the file's columns left out),
 * sample interval, fundamental and the SHA-256 of the file analysed. Empty when the sheet has no analysis.
 *
 * @example describeSetup({ analysis: null }) // []
 */
export function describeSetup(sheet: SetupInput): SetupLine[] {
  const a = sheet.analysis;
  if (!a) return [];
  const mapping = (a.setup?.mapping ?? {}) as {
    channels?: Record<string, ChannelSetup>;
    intervalMapping?: { timestamp?: { column?: string; timeColumn?: string }; columns?: IntervalColumnSetup[] };
  };
  const unmapped = Array.isArray(a.setup?.unmappedColumns) ? (a.setup.unmappedColumns as string[]) : undefined;
  const rows: SetupLine[] = [];
  if (mapping.intervalMapping?.columns) {
    rows.push(...intervalColumnLines({ ...mapping.intervalMapping, columns: mapping.intervalMapping.columns }, unmapped));
  } else {
    const channels = mapping.channels ?? {};
    const described = a.result.channels.map((c) => {
      const set = channels[c.name];
      const scale = set?.scale ?? 1;
      return `${c.name}: ${c.quantity}${c.phase ? ` phase ${c.phase.toUpperCase()}` : ""}, scale × ${formatNumber(scale)}`;
    });
    const ignored = Object.entries(channels).filter(([, v]) => v.ignore).map(([k]) => `${k} (left out)`);
    rows.push(["Channel map and scales", [...described, ...ignored].join("; ") || "—"]);
    rows.push(["Sample interval", `${formatNumber(a.result.sampleIntervalS * 1e6)} µs`]);
  }
  rows.push(["Fundamental", `${formatNumber(a.result.fundamentalHz)} Hz`]);
  rows.push(["File SHA-256", a.fileSha256 ?? "not recorded (uploaded before hashes were kept)"]);
  return rows;
}
