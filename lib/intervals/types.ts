// Interval logs: values per interval (e.g. 10-minute averages) exported by a logging analyser.
import { z } from "zod";

export const TimestampFormatSchema = z.enum(["auto", "iso", "ymd", "dmy"]);

/** One imported column: which channel, quantity and harmonic order (or r.m.s./THD) it holds. */
export const IntervalColumnSchema = z
  .object({
    /** Header text, exactly as in the file. */
    column: z.string().min(1),
    channel: z.string().min(1),
    quantity: z.enum(["current", "voltage"]),
    /** `order` with `order` ≥ 1 (1 = fundamental), `rms` (total r.m.s.), `thd` (%). */
    kind: z.enum(["order", "rms", "thd"]),
    order: z.number().int().min(1).max(100).optional(),
    /** A or V; `%` = percent of the channel's fundamental (orders) or THD in %. */
    unit: z.enum(["A", "V", "%"]),
    /** What the logger stored per interval; informational (the import takes the values as they are). */
    statistic: z.enum(["avg", "max", "min", "p95", "p99", "other"]).default("avg"),
    /** Multiplies A/V values (CT/PT ratio). */
    scale: z.number().positive().default(1),
  })
  .refine((c) => (c.kind === "order") === (c.order !== undefined), { message: "an order column needs `order`, and only an order column may have one" })
  .refine((c) => c.kind !== "thd" || c.unit === "%", { message: "a THD column must be in %" })
  .refine((c) => c.kind !== "rms" || c.unit !== "%", { message: "an r.m.s. column must be in A or V" });

export const IntervalMappingSchema = z.object({
  timestamp: z.object({
    column: z.string().min(1),
    /** A separate time-of-day column when the date and the time are in two columns. */
    timeColumn: z.string().min(1).optional(),
    /**
     * `iso`: YYYY-MM-DDTHH:MM[:SS[.fff]][Z|±HH:MM]; `ymd`: YYYY-MM-DD HH:MM[:SS[.fff]];
     * `dmy`: DD.MM.YYYY HH:MM[:SS[.fff]]; `auto`: whichever matches.
     */
    format: TimestampFormatSchema.default("auto"),
    /** Offset of timestamps without a zone, minutes east of UTC (default 0: read as UTC). */
    utcOffsetMinutes: z.number().int().min(-900).max(900).default(0),
  }),
  columns: z.array(IntervalColumnSchema).min(1),
  /** 1-based line of the header row; default: the first line containing every mapped header. */
  headerLine: z.number().int().positive().optional(),
  /** Default: the most frequent of `,` `;` tab in the header line. */
  delimiter: z.enum([",", ";", "\t"]).optional(),
  /** Default: `,` when the delimiter is not a comma and numbers look like 1,23. */
  decimalSeparator: z.enum([".", ","]).optional(),
  /** Nominal interval, s; default: the median spacing of the timestamps. */
  intervalS: z.number().positive().optional(),
});

export type TimestampFormat = z.infer<typeof TimestampFormatSchema>;
export type IntervalColumn = z.infer<typeof IntervalColumnSchema>;
export type IntervalColumnInput = z.input<typeof IntervalColumnSchema>;
export type IntervalMapping = z.infer<typeof IntervalMappingSchema>;
export type IntervalMappingInput = z.input<typeof IntervalMappingSchema>;

/** A stretch of missing intervals, reported rather than bridged. */
export interface IntervalGap {
  /** Line of the row after which the gap starts. */
  afterLine: number;
  fromMs: number;
  toMs: number;
  durationS: number;
  /** Whole intervals missing. */
  missingIntervals: number;
}

export interface IntervalLogChannel {
  name: string;
  quantity: "current" | "voltage";
  unit: "A" | "V";
  /** Per-order values in A or V (order 1 = fundamental), one per row. */
  orders: Map<number, Float64Array>;
  rms: Float64Array | null;
  thdPercent: Float64Array | null;
  /** What the logger stored per interval in the r.m.s., order-1 and THD columns (the mapping's `statistic`); absent: not said. */
  logged?: { rms?: IntervalColumn["statistic"]; fundamental?: IntervalColumn["statistic"]; thd?: IntervalColumn["statistic"] };
}

export interface IntervalLog {
  /** Nominal interval, s. */
  intervalS: number;
  /** Start of each row, ms since the epoch (zone-less timestamps read with utcOffsetMinutes). */
  timestampsMs: Float64Array;
  /** Source line of each row (1-based). */
  lines: Int32Array;
  channels: IntervalLogChannel[];
  gaps: IntervalGap[];
  warnings: string[];
  /** Header columns the mapping leaves out (neither timestamp nor mapped), in file order. */
  unmappedColumns: string[];
}

/** One value series for charts, in the unit of its limit. */
export interface IntervalTrendSeries {
  /** "h5", "TDD", "THD". */
  name: string;
  order?: number;
  unit: string;
  values: number[];
  /** Table limit (× 1); null when none applies or context is missing. */
  limit: number | null;
  /** The limit each time rule compares with (table limit × multiplier). */
  ruleLimits: Array<{ rule: string; label: string; limit: number }>;
}

export interface IntervalTrend {
  channel: string;
  /** Log rows behind each point when the series were thinned for the charts (thinIntervalTrends); absent or 1: one point per row. */
  rowsPerPoint?: number;
  timestampsMs: number[];
  orders: IntervalTrendSeries[];
  aggregates: IntervalTrendSeries[];
}
