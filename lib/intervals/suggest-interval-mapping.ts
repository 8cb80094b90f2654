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
// Channel tokens: I1, IL2, Ia, I_b, IN, U1, UL3, V2, Va, Van, U12 … (letter I → current, U/V → voltage).
const CHANNEL = /(?:^|[^a-z0-9])([IUV])\s*[_-]?\s*(L?[123N]|[abcn]{1,2}|[123]{2})(?![a-z0-9])/i;
const PHASE_ONLY = /(?:^|[^a-z0-9])(L[123N])(?![a-z0-9])/i;
const ORDER = /(?:^|[^a-z])(?:h|harm(?:onic)?s?|ord(?:er)?|n)\s*[_\-#.]?\s*(\d{1,3})(?!\d)/i;
const ORDER_SUFFIX = /(\d{1,3})(?:st|nd|rd|th)\s*harm/i;
const FUNDAMENTAL = /fund(?:amental)?|(?:^|[^a-z])h\s*[_-]?0?1(?!\d)/i;
const THD = /thd/i;
const RMS = /rms|true\s*rms|(?:^|[^a-z])eff(?:ective)?(?![a-z])/i;

function unitOf(header: string): "A" | "V" | "%" | undefined {
  const bracket = /[([]\s*(%|a|v|ka|kv|ma|mv)\s*[)\]]|[_\s](%|a|v)$|\bin\s+(%|a|v)\b/i.exec(header);
  const raw = (bracket?.[1] ?? bracket?.[2] ?? bracket?.[3])?.toLowerCase();
  if (raw === "%") return "%";
  if (raw === "a") return "A";
  if (raw === "v") return "V";
  if (header.includes("%")) return "%";
  return undefined; // kA/mA/kV/mV: ask the user (scale)
}

function statisticOf(header: string): IntervalColumnSuggestion["statistic"] {
  if (/\b(?:avg|mean|average|aver)\b/i.test(header)) return "avg";
  if (/\bmax(?:imum)?\b/i.test(header)) return "max";
  if (/\bmin(?:imum)?\b/i.test(header)) return "min";
  if (/\bp\s*95\b|95\s*(?:th|%)/i.test(header)) return "p95";
  if (/\bp\s*99\b|99\s*(?:th|%)/i.test(header)) return "p99";
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
    const channel = CHANNEL.exec(text);
    if (channel) {
      // Phase letters lower case (Ia, Vab), numbers and L/N upper case (I1, IL2, IN).
      const suffix = /^[abc]{1,2}$/i.test(channel[2]!) ? channel[2]!.toLowerCase() : channel[2]!.toUpperCase();
      suggestion.channel = `${channel[1]!.toUpperCase()}${suffix}`;
      suggestion.quantity = channel[1]!.toUpperCase() === "I" ? "current" : "voltage";
    } else {
      const phase = PHASE_ONLY.exec(text);
      if (phase) suggestion.channel = phase[1]!.toUpperCase();
    }
    const unit = unitOf(text);
    if (unit) suggestion.unit = unit;
    if (!suggestion.quantity && (unit === "A" || unit === "V")) suggestion.quantity = unit === "A" ? "current" : "voltage";
    if (THD.test(text)) {
      suggestion.kind = "thd";
      suggestion.unit = "%";
    } else {
      const order = ORDER.exec(text.replace(CHANNEL, " ")) ?? ORDER_SUFFIX.exec(text);
      if (order && Number(order[1]) >= 1 && Number(order[1]) <= 100) {
        suggestion.kind = "order";
        suggestion.order = Number(order[1]);
      } else if (FUNDAMENTAL.test(text)) {
        suggestion.kind = "order";
        suggestion.order = 1;
      } else if (RMS.test(text) || (suggestion.channel && (unit === "A" || unit === "V"))) suggestion.kind = "rms";
    }
    const statistic = statisticOf(text);
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
              ...(c.statistic ? { statistic: c.statistic } : {}),
            }),
          ),
        }
      : null;
  return { timestamp, columns, mapping };
}
