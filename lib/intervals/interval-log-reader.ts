// The rows of an interval log, one at a time: checked against the mapping and kept as numbers per
// mapped column only — the text is never held whole, so a large log is read as a stream.
import { parseNumber } from "@/lib/analysis/parse-number";
import { MAX_SAMPLE_MAGNITUDE } from "@/lib/analysis/row-collector";
import { formatDurationS } from "@/lib/reports/result-wording";
import { IntervalLogError, type IntervalLogIssue } from "./errors";
import { parseTimestamp, TIMESTAMP_FORMATS_TEXT } from "./parse-timestamp";
import { IntervalMappingSchema, type IntervalGap, type IntervalLog, type IntervalLogChannel, type IntervalMapping, type IntervalMappingInput } from "./types";

const MAX_ISSUES = 20;
const CHUNK = 8192;

/** A column of numbers kept in fixed chunks (no doubling slack), joined once at the end. */
class ChunkedColumn {
  private readonly chunks: Float64Array[] = [];
  private fill = CHUNK;
  length = 0;

  push(value: number): void {
    if (this.fill === CHUNK) {
      this.chunks.push(new Float64Array(CHUNK));
      this.fill = 0;
    }
    this.chunks[this.chunks.length - 1]![this.fill++] = value;
    this.length += 1;
  }

  /** The values as one array; the chunks are released. */
  take(): Float64Array {
    const out = new Float64Array(this.length);
    this.chunks.forEach((chunk, i) => out.set(i === this.chunks.length - 1 ? chunk.subarray(0, this.fill) : chunk, i * CHUNK));
    this.chunks.length = 0;
    return out;
  }
}

/** "2024-03-04 00:10 UTC" (seconds only where they are not zero), as every date on a sheet reads. */
function formatMs(ms: number): string {
  const iso = new Date(ms).toISOString();
  const seconds = iso.slice(16, 23) === ":00.000" ? "" : iso.slice(16, 19);
  return `${iso.slice(0, 10)} ${iso.slice(11, 16)}${seconds} UTC`;
}

/**
 * Consumes the parsed rows of an interval log (cells already split by papaparse) with an explicit
 * mapping: finds the header (the mapping's `headerLine`, else the first row holding every mapped
 * column), checks the mapping against it, then converts each data row. `full` turns true after 20
 * problems (the caller may stop reading); `finish()` throws them or returns the log.
 *
 * Hard errors (IntervalLogError, naming line and column): mapped header missing, duplicate
 * mapping, `%` order without a fundamental column, malformed row (wrong cell count), non-numeric or
 * empty cell, unparseable timestamp, timestamps not strictly increasing. Gaps (spacing > 1.5 × the
 * interval) are reported in `gaps` and `warnings`, never bridged. Memory: 8 bytes per mapped cell.
 *
 * @example
 * const reader = new IntervalLogReader(mapping, ".");
 * rows.forEach((cells, i) => reader.row(cells, i + 1));
 * const log = reader.finish();
 */
export class IntervalLogReader {
  private readonly mapping: IntervalMapping;
  private readonly wanted: string[];
  private readonly decimalComma: boolean;
  private readonly issues: IntervalLogIssue[] = [];
  private headerLine = -1;
  private headerBroken = false;
  private headerCount = 0;
  private unmapped: string[] = [];
  private timestampIndex = -1;
  private timeIndex = -1;
  private valueIndices: number[] = [];
  private readonly raw: ChunkedColumn[];
  private readonly times: number[] = [];
  private readonly rowLines: number[] = [];

  /** @param decimalSeparator the mapping's, else the one detected from the file's first rows. */
  constructor(mappingInput: IntervalMappingInput, decimalSeparator: "." | ",") {
    this.mapping = IntervalMappingSchema.parse(mappingInput);
    this.wanted = [this.mapping.timestamp.column, ...(this.mapping.timestamp.timeColumn ? [this.mapping.timestamp.timeColumn] : []), ...this.mapping.columns.map((c) => c.column)];
    this.decimalComma = (this.mapping.decimalSeparator ?? decimalSeparator) === ",";
    this.raw = this.mapping.columns.map(() => new ChunkedColumn());
  }

  /** True once 20 problems were found: reading further adds nothing. */
  get full(): boolean {
    return this.headerBroken || this.issues.length >= MAX_ISSUES;
  }

  /** One row of trimmed cells at 1-based `lineNo`. */
  row(cells: string[], lineNo: number): void {
    if (this.full) return;
    if (this.headerLine < 0) {
      const isHeader = this.mapping.headerLine !== undefined ? lineNo === this.mapping.headerLine : this.wanted.every((name) => cells.includes(name));
      if (isHeader) this.takeHeader(cells, lineNo);
      return;
    }
    if (cells.length === 1 && cells[0] === "") return;
    if (cells.length !== this.headerCount) {
      this.issues.push({ line: lineNo, message: `malformed row: expected ${this.headerCount} cells as in the header (line ${this.headerLine}), found ${cells.length}` });
      return;
    }
    const { timestamp } = this.mapping;
    const stampText = this.timeIndex >= 0 ? `${cells[this.timestampIndex]} ${cells[this.timeIndex]}` : cells[this.timestampIndex]!;
    const ms = parseTimestamp(stampText, timestamp.format, timestamp.utcOffsetMinutes);
    if (ms === null) {
      this.issues.push({ line: lineNo, column: timestamp.column, message: `"${stampText}" is not a timestamp in the accepted formats (${TIMESTAMP_FORMATS_TEXT})` });
      return;
    }
    const previous = this.times[this.times.length - 1];
    if (previous !== undefined && ms <= previous) {
      this.issues.push({
        line: lineNo,
        column: timestamp.column,
        message: `timestamp ${formatMs(ms)} is ${ms === previous ? "the same as" : "before"} the previous row's (line ${this.rowLines[this.rowLines.length - 1]}, ${formatMs(previous)}); timestamps must increase`,
      });
      return;
    }
    const values: number[] = [];
    for (let j = 0; j < this.valueIndices.length; j++) {
      const cell = cells[this.valueIndices[j]!]!;
      const compact = cell.replace(/\s/g, "");
      // parseNumber refuses non-finite text; a decimal literal beyond double range ("1e400") is out of range, not "not a number".
      const value = /^[+-]?[\d.,]+e[+-]?\d+$/i.test(compact) && !Number.isFinite(Number(compact.replace(",", "."))) ? Infinity : parseNumber(compact, this.decimalComma);
      if (Number.isNaN(value)) {
        this.issues.push({ line: lineNo, column: this.mapping.columns[j]!.column, message: cell === "" ? "empty cell (a number is needed)" : `"${cell}" is not a number` });
        return;
      }
      // A value whose square overflows would turn r.m.s./TDD sums into Infinity, which judges as "at the limit".
      if (!(Math.abs(value * this.mapping.columns[j]!.scale) <= MAX_SAMPLE_MAGNITUDE)) {
        this.issues.push({
          line: lineNo,
          column: this.mapping.columns[j]!.column,
          message: `"${cell}" is out of range: magnitudes above ${MAX_SAMPLE_MAGNITUDE.toPrecision(1)} (after the scale) overflow the sums and cannot be judged`,
        });
        return;
      }
      values.push(value);
    }
    for (let j = 0; j < values.length; j++) this.raw[j]!.push(values[j]!);
    this.times.push(ms);
    this.rowLines.push(lineNo);
  }

  private takeHeader(headers: string[], lineNo: number): void {
    const { mapping } = this;
    this.headerLine = lineNo;
    this.headerCount = headers.length;
    const used = new Set(this.wanted);
    this.unmapped = headers.filter((header) => header.trim() !== "" && !used.has(header));
    const indexOf = new Map<string, number>();
    headers.forEach((header, i) => {
      if (!indexOf.has(header)) indexOf.set(header, i);
    });
    const issues = this.issues;
    for (const name of this.wanted) if (!indexOf.has(name)) issues.push({ line: lineNo, column: name, message: "mapped column not found in the header" });
    const seen = new Map<string, string>();
    for (const c of mapping.columns) {
      const key = `${c.channel}|${c.kind}|${c.order ?? ""}`;
      const previous = seen.get(key);
      if (previous) issues.push({ line: lineNo, column: c.column, message: `maps the same ${c.kind === "order" ? `order ${c.order}` : c.kind} of channel ${c.channel} as "${previous}"` });
      seen.set(key, c.column);
      if (c.kind === "order" && c.unit === "%" && c.order !== 1 && !mapping.columns.some((f) => f.channel === c.channel && f.kind === "order" && f.order === 1 && f.unit !== "%")) {
        issues.push({ line: lineNo, column: c.column, message: `is in % of the fundamental but channel ${c.channel} has no fundamental (order 1) column in A or V` });
      }
      if ((c.unit === "A" && c.quantity === "voltage") || (c.unit === "V" && c.quantity === "current")) {
        issues.push({ line: lineNo, column: c.column, message: `unit ${c.unit} does not fit a ${c.quantity} channel` });
      }
      const other = mapping.columns.find((o) => o.channel === c.channel && o.quantity !== c.quantity);
      if (other) issues.push({ line: lineNo, column: c.column, message: `channel ${c.channel} is mapped as both current and voltage` });
    }
    // A broken mapping makes every row wrong: stop at the header.
    this.headerBroken = issues.length > 0;
    this.timestampIndex = indexOf.get(mapping.timestamp.column) ?? -1;
    this.timeIndex = mapping.timestamp.timeColumn ? (indexOf.get(mapping.timestamp.timeColumn) ?? -1) : -1;
    this.valueIndices = mapping.columns.map((c) => indexOf.get(c.column) ?? -1);
  }

  /** The imported log. @throws IntervalLogError with the problems found (up to 20). */
  finish(): IntervalLog {
    const { mapping } = this;
    const { issues } = this;
    if (this.headerLine < 0) {
      throw new IntervalLogError([{ line: 1, message: `no header line holds every mapped column (${this.wanted.map((name) => `"${name}"`).join(", ")})` }]);
    }
    if (issues.length > 0) throw new IntervalLogError(issues.slice(0, MAX_ISSUES));
    return { ...buildIntervalLog(mapping, this.times, this.rowLines, this.raw.map((column) => column.take()), this.headerLine), unmappedColumns: this.unmapped };
  }
}

/** Interval, gaps, warnings and per-channel series from the accepted rows. */
function buildIntervalLog(mapping: IntervalMapping, times: number[], rowLines: number[], raw: Float64Array[], headerLine: number): Omit<IntervalLog, "unmappedColumns"> {
  if (times.length < 2) throw new IntervalLogError([{ line: headerLine, message: `an interval log needs at least two rows; found ${times.length}` }]);

  // Interval: given, or the median spacing.
  const spacings = times.slice(1).map((t, k) => (t - times[k]!) / 1000);
  const sorted = [...spacings].sort((a, b) => a - b);
  const intervalS = mapping.intervalS ?? Math.round(sorted[Math.floor(sorted.length / 2)]! * 1000) / 1000;
  const gaps: IntervalGap[] = [];
  const warnings: string[] = [];
  let irregular = 0;
  spacings.forEach((spacingS, k) => {
    if (spacingS > 1.5 * intervalS) {
      const gap = {
        afterLine: rowLines[k]!,
        fromMs: times[k]! + intervalS * 1000,
        toMs: times[k + 1]!,
        durationS: spacingS - intervalS,
        missingIntervals: Math.round(spacingS / intervalS) - 1,
      };
      gaps.push(gap);
      warnings.push(
        `gap of ${formatDurationS(gap.durationS)} (${gap.missingIntervals} interval${gap.missingIntervals === 1 ? "" : "s"} missing) between line ${rowLines[k]} (${formatMs(times[k]!)}) and line ${rowLines[k + 1]} (${formatMs(times[k + 1]!)}); not bridged`,
      );
    } else if (Math.abs(spacingS - intervalS) > 0.1 * intervalS) irregular += 1;
  });
  if (irregular > 0) warnings.push(`${irregular} row spacing(s) differ from the ${formatDurationS(intervalS)} interval by more than 10 %`);

  // Channels in mapping order; % orders × fundamental.
  const n = times.length;
  const channels = new Map<string, IntervalLogChannel>();
  for (const c of mapping.columns) {
    if (!channels.has(c.channel)) {
      channels.set(c.channel, { name: c.channel, quantity: c.quantity, unit: c.quantity === "current" ? "A" : "V", orders: new Map(), rms: null, thdPercent: null });
    }
  }
  const fundamentalOf = (channel: string): Float64Array | undefined => {
    const j = mapping.columns.findIndex((c) => c.channel === channel && c.kind === "order" && c.order === 1 && c.unit !== "%");
    return j < 0 ? undefined : Float64Array.from(raw[j]!, (v) => v * mapping.columns[j]!.scale);
  };
  // Fundamentals of channels with % orders, taken before the columns are scaled in place.
  const fundamentals = new Map<string, Float64Array | undefined>();
  for (const c of mapping.columns) if (c.unit === "%" && c.kind === "order" && !fundamentals.has(c.channel)) fundamentals.set(c.channel, fundamentalOf(c.channel));
  mapping.columns.forEach((c, j) => {
    const channel = channels.get(c.channel)!;
    const values = raw[j]!; // converted in place below
    if (c.kind === "thd") {
      channel.thdPercent = values;
      channel.logged = { ...channel.logged, thd: c.statistic };
      return;
    }
    if (c.unit === "%") {
      const fundamental = fundamentals.get(c.channel)!;
      for (let k = 0; k < n; k++) values[k] = (values[k]! / 100) * fundamental[k]!;
    } else for (let k = 0; k < n; k++) values[k] = values[k]! * c.scale;
    if (c.kind === "rms") {
      channel.rms = values;
      channel.logged = { ...channel.logged, rms: c.statistic };
    } else {
      channel.orders.set(c.order as number, values);
      if (c.order === 1) channel.logged = { ...channel.logged, fundamental: c.statistic };
    }
  });
  for (const channel of channels.values()) {
    if (channel.orders.size === 0 && channel.thdPercent === null) warnings.push(`channel ${channel.name} has no harmonic or THD column`);
  }
  return { intervalS, timestampsMs: Float64Array.from(times), lines: Int32Array.from(rowLines), channels: [...channels.values()], gaps, warnings };
}
