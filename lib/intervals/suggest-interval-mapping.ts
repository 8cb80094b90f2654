import { detectChannel } from "../analysis/detect-channel";
import { parseHeader } from "../analysis/parse-header";
import type { HeaderToken } from "../analysis/tokenize-header";
import type { IntervalColumnInput, IntervalMappingInput, TimestampFormat } from "./types";

/** A guess for one column; fields are absent where the header says nothing. */
export interface IntervalColumnSuggestion {
  column: string;
  role: "timestamp" | "time" | "value" | "unknown";
  channel?: string;
  quantity?: "current" | "voltage";
  kind?: "order" | "rms" | "thd";
  order?: number;
  unit?: "A" | "V" | "%";
  /** Factor to A or V when the header's unit has a prefix (kA → 1000). */
  scale?: number;
  statistic?: "avg" | "max" | "min" | "p95" | "p99" | "other";
  /** Whether the draft mapping imports it: an averaged (or unlabelled) value with channel, kind and unit known. */
  use: boolean;
  /** What could not be guessed, for the mapping form. */
  missing: string[];
}

export interface IntervalMappingSuggestion {
  timestamp: { column: string; timeColumn?: string; format?: TimestampFormat } | null;
  columns: IntervalColumnSuggestion[];
  /** A mapping built from the confident suggestions; null when no timestamp or no usable column was found. */
  mapping: IntervalMappingInput | null;
}

const TIMESTAMP = /^(?:time\s*stamp|date\s*[/_-]?\s*time|date\s*&\s*time|utc|local\s*time|zeitstempel|datum\s*[/_-]?\s*zeit)$/i;
const DATE_ONLY = /^(?:date|datum|day)$/i;
const TIME_ONLY = /^(?:time|zeit|time\s*of\s*day|clock)$/i;
const ORDER_WORDS = new Set(["h", "harm", "harmonic", "harmonics", "ord", "order"]);
const ORDINAL = new Set(["st", "nd", "rd", "th"]);
const RMS_WORDS = new Set(["rms", "trms", "eff", "effective"]);
const STATISTIC: Record<string, IntervalColumnSuggestion["statistic"]> = {
  avg: "avg", mean: "avg", average: "avg", aver: "avg", max: "max", maximum: "max", min: "min", minimum: "min",
};

/** Harmonic order from whole tokens: "H5", "h05", "Harm 11", "order 7", "5th harmonic"; 1 for "fund"/"fundamental". */
function orderOf(tokens: HeaderToken[]): number | undefined {
  for (let i = 0; i < tokens.length; i++) {
    const t = tokens[i]!;
    const next = tokens[i + 1];
    if (ORDER_WORDS.has(t.lower) && next?.numeric) return Number(next.text);
    if (t.numeric && next && ORDINAL.has(next.lower) && tokens[i + 2]?.lower.startsWith("harm")) return Number(t.text);
    if (t.lower === "fund" || t.lower === "fundamental") return 1;
  }
  return undefined;
}

/** Statistic from whole tokens (avg/mean, max, min, p95 / 95th, p99 / 99th). */
function statisticOf(tokens: HeaderToken[]): IntervalColumnSuggestion["statistic"] {
  for (let i = 0; i < tokens.length; i++) {
    const t = tokens[i]!;
    const stat = STATISTIC[t.lower];
    if (stat) return stat;
    const percentile = t.lower === "p" ? tokens[i + 1]?.text : t.numeric && ORDINAL.has(tokens[i + 1]?.lower ?? "") && !tokens[i + 2]?.lower.startsWith("harm") ? t.text : undefined;
    if (percentile === "95") return "p95";
    if (percentile === "99") return "p99";
  }
  return undefined;
}

/**
 * Suggest how to read an interval log from its header cells, by pattern only — no vendor's
 * layout is assumed: a timestamp column (or date + time columns), and for each other column a
 * guess of channel (I1, Ia, IL2, U1, Va …), quantity (I → current, U/V → voltage), harmonic order
 * (`H5`, `Harm 5`, `h05`, `5th harmonic`), r.m.s. or THD, unit (A, V, % of fundamental) and
 * statistic (avg / max / min / p95 / p99). Every guess is a suggestion for the mapping form;
 * `mapping` is a draft built from averaged (or unlabelled) columns whose channel, kind and unit
 * were all recognised.
 *
 * Complexity O(headers). Never throws.
 *
 * @example
 * suggestIntervalMapping(["Timestamp", "I1 H5 avg [A]", "I1 THD avg [%]"]).columns[1]
 * // { column: "I1 H5 avg [A]", role: "value", channel: "I1", quantity: "current", kind: "order", order: 5, unit: "A", statistic: "avg", use: true, missing: [] }
 */
export function suggestIntervalMapping(headers: string[]): IntervalMappingSuggestion {
  const columns: IntervalColumnSuggestion[] = headers.map((header) => {
    const text = header.trim();
    if (TIMESTAMP.test(text) || DATE_ONLY.test(text)) return { column: header, role: "timestamp", use: false, missing: [] };
    if (TIME_ONLY.test(text)) return { column: header, role: "time", use: false, missing: [] };
    const suggestion: IntervalColumnSuggestion = { column: header, role: "value", use: false, missing: [] };
    // The waveform import's recogniser: whole tokens, units only from a unit position.
    const recognised = detectChannel(parseHeader(text));
    if (recognised.label) suggestion.channel = recognised.label;
    if (recognised.quantity) suggestion.quantity = recognised.quantity;
    const unit = recognised.unit;
    if (unit && unit.baseUnit !== "s") {
      suggestion.unit = unit.baseUnit;
      // kA, mV…: the scale turns the logged values into A or V.
      if (unit.toBase !== 1) suggestion.scale = unit.toBase;
    }
    const tokens = recognised.tokens;
    const order = orderOf(tokens);
    if (tokens.some((t) => t.lower.startsWith("thd"))) {
      suggestion.kind = "thd";
      suggestion.unit = "%";
      delete suggestion.scale;
    } else if (order !== undefined && order >= 1 && order <= 100) {
      suggestion.kind = "order";
      suggestion.order = order;
    } else if (tokens.some((t) => RMS_WORDS.has(t.lower)) || (suggestion.channel && (suggestion.unit === "A" || suggestion.unit === "V"))) {
      suggestion.kind = "rms";
    }
    const statistic = statisticOf(tokens);
    if (statistic) suggestion.statistic = statistic;
    if (!suggestion.channel) suggestion.missing.push("channel");
    if (!suggestion.quantity) suggestion.missing.push("quantity");
    if (!suggestion.kind) suggestion.missing.push("order, r.m.s. or THD");
    if (!suggestion.unit) suggestion.missing.push("unit");
    if (suggestion.missing.length === 4) suggestion.role = "unknown";
    suggestion.use = suggestion.missing.length === 0 && (statistic === undefined || statistic === "avg");
    return suggestion;
  });

  const dateColumn = columns.find((c) => c.role === "timestamp");
  const timeColumn = columns.find((c) => c.role === "time");
  const timestamp = dateColumn
    ? { column: dateColumn.column, ...(timeColumn && DATE_ONLY.test(dateColumn.column.trim()) ? { timeColumn: timeColumn.column } : {}) }
    : timeColumn
      ? { column: timeColumn.column }
      : null;
  if (timestamp && !dateColumn && timeColumn) timeColumn.role = "timestamp";

  const used = columns.filter((c) => c.use);
  const mapping: IntervalMappingInput | null =
    timestamp && used.length > 0
      ? {
          timestamp,
          columns: used.map(
            (c): IntervalColumnInput => ({
              column: c.column,
              channel: c.channel as string,
              quantity: c.quantity as "current" | "voltage",
              kind: c.kind as "order" | "rms" | "thd",
              ...(c.kind === "order" ? { order: c.order } : {}),
              unit: c.unit as "A" | "V" | "%",
              ...(c.scale !== undefined ? { scale: c.scale } : {}),
              ...(c.statistic ? { statistic: c.statistic } : {}),
            }),
          ),
        }
      : null;
  return { timestamp, columns, mapping };
}
