import { MAX_SAMPLE_MAGNITUDE } from "../analysis/row-collector";
import { IntervalLogError, type IntervalLogIssue } from "./errors";
import { parseTimestamp, TIMESTAMP_FORMATS_TEXT } from "./parse-timestamp";
import { splitDelimitedLine } from "./split-delimited-line";
import { IntervalMappingSchema, type IntervalGap, type IntervalLog, type IntervalLogChannel, type IntervalMappingInput } from "./types";

const MAX_ISSUES = 20;
const NUMBER = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/;

function formatMs(ms: number): string {
  return new Date(ms).toISOString().replace("T", " ").replace(/\.000Z$/, "Z");
}

function formatS(seconds: number): string {
  if (seconds >= 3600) return `${Number((seconds / 3600).toPrecision(3))} h`;
  if (seconds >= 60) return `${Number((seconds / 60).toPrecision(3))} min`;
  return `${Number(seconds.toPrecision(3))} s`;
}

/**
 * Import an interval log (one row per interval: timestamp + values per channel) with an explicit
 * mapping — usually `suggestIntervalMapping`'s draft, checked by the user.
 *
 * Validates and converts: A/V columns × scale; `%` order columns × the same channel's
 * fundamental (order 1) column; THD stays in %. Hard errors (IntervalLogError, message naming
 * line and column): mapped header missing, duplicate mapping, `%` order without a fundamental
 * column, malformed row (wrong cell count), non-numeric or empty cell, unparseable timestamp,
 * timestamps not strictly increasing. Gaps (spacing > 1.5 × the interval) are reported in `gaps`
 * and `warnings` with where and how long — never bridged. The interval is the mapping's
 * `intervalS` or the median spacing. Timestamp formats: see parseTimestamp.
 *
 * Complexity O(rows × columns). Throws IntervalLogError or a zod error for an invalid mapping.
 *
 * @example
 * const log = importIntervalLog(csv, suggestIntervalMapping(headers).mapping!);
 * log.channels[0]?.orders.get(5) // Float64Array of A, one per row
 */
export function importIntervalLog(text: string, mappingInput: IntervalMappingInput): IntervalLog {
  const mapping = IntervalMappingSchema.parse(mappingInput);
  const lines = text.replace(/^\uFEFF/, "").split(/\r\n|\n|\r/);
  const wanted = [mapping.timestamp.column, ...(mapping.timestamp.timeColumn ? [mapping.timestamp.timeColumn] : []), ...mapping.columns.map((c) => c.column)];

  // Header line and delimiter.
  const delimiterOf = (line: string): string =>
    mapping.delimiter ?? ([",", ";", "\t"] as const).reduce((best, d) => (line.split(d).length > line.split(best).length ? d : best), "," as string);
  let headerIndex = mapping.headerLine !== undefined ? mapping.headerLine - 1 : -1;
  if (headerIndex < 0) {
    headerIndex = lines.findIndex((line) => {
      const cells = splitDelimitedLine(line, delimiterOf(line));
      return wanted.every((name) => cells.includes(name));
    });
  }
  const headerText = lines[headerIndex];
  if (headerIndex < 0 || headerText === undefined) {
    throw new IntervalLogError([{ line: 1, message: `no header line holds every mapped column (${wanted.map((name) => `"${name}"`).join(", ")})` }]);
  }
  const delimiter = delimiterOf(headerText);
  const headers = splitDelimitedLine(headerText, delimiter);
  const headerLine = headerIndex + 1;
  const indexOf = new Map<string, number>();
  headers.forEach((header, i) => {
    if (!indexOf.has(header)) indexOf.set(header, i);
  });

  const issues: IntervalLogIssue[] = [];
  for (const name of wanted) if (!indexOf.has(name)) issues.push({ line: headerLine, column: name, message: "mapped column not found in the header" });
  const seen = new Map<string, string>();
  for (const c of mapping.columns) {
    const key = `${c.channel}|${c.kind}|${c.order ?? ""}`;
    const previous = seen.get(key);
    if (previous) issues.push({ line: headerLine, column: c.column, message: `maps the same ${c.kind === "order" ? `order ${c.order}` : c.kind} of channel ${c.channel} as "${previous}"` });
    seen.set(key, c.column);
    if (c.kind === "order" && c.unit === "%" && c.order !== 1 && !mapping.columns.some((f) => f.channel === c.channel && f.kind === "order" && f.order === 1 && f.unit !== "%")) {
      issues.push({ line: headerLine, column: c.column, message: `is in % of the fundamental but channel ${c.channel} has no fundamental (order 1) column in A or V` });
    }
    if ((c.unit === "A" && c.quantity === "voltage") || (c.unit === "V" && c.quantity === "current")) {
      issues.push({ line: headerLine, column: c.column, message: `unit ${c.unit} does not fit a ${c.quantity} channel` });
    }
    const other = mapping.columns.find((o) => o.channel === c.channel && o.quantity !== c.quantity);
    if (other) issues.push({ line: headerLine, column: c.column, message: `channel ${c.channel} is mapped as both current and voltage` });
  }
  if (issues.length > 0) throw new IntervalLogError(issues.slice(0, MAX_ISSUES));

  // Decimal separator: a comma when the delimiter is not one and the data look like "1,23".
  let decimal = mapping.decimalSeparator;
  if (decimal === undefined) {
    decimal = ".";
    if (delimiter !== ",") {
      const sample = lines.slice(headerIndex + 1, headerIndex + 6).flatMap((line) => splitDelimitedLine(line, delimiter));
      if (sample.some((cell) => /^[+-]?\d+,\d+$/.test(cell))) decimal = ",";
    }
  }

  const timestampIndex = indexOf.get(mapping.timestamp.column)!;
  const timeIndex = mapping.timestamp.timeColumn ? indexOf.get(mapping.timestamp.timeColumn)! : -1;
  const valueIndices = mapping.columns.map((c) => indexOf.get(c.column)!);
  const raw: number[][] = mapping.columns.map(() => []);
  const times: number[] = [];
  const rowLines: number[] = [];
  for (let i = headerIndex + 1; i < lines.length && issues.length < MAX_ISSUES; i++) {
    const line = lines[i]!;
    if (line.trim() === "") continue;
    const lineNo = i + 1;
    const cells = splitDelimitedLine(line, delimiter);
    if (cells.length !== headers.length) {
      issues.push({ line: lineNo, message: `malformed row: expected ${headers.length} cells as in the header (line ${headerLine}), found ${cells.length}` });
      continue;
    }
    const stampText = timeIndex >= 0 ? `${cells[timestampIndex]} ${cells[timeIndex]}` : cells[timestampIndex]!;
    const ms = parseTimestamp(stampText, mapping.timestamp.format, mapping.timestamp.utcOffsetMinutes);
    if (ms === null) {
      issues.push({ line: lineNo, column: mapping.timestamp.column, message: `"${stampText}" is not a timestamp in the accepted formats (${TIMESTAMP_FORMATS_TEXT})` });
      continue;
    }
    const previous = times[times.length - 1];
    if (previous !== undefined && ms <= previous) {
      issues.push({
        line: lineNo,
        column: mapping.timestamp.column,
        message: `timestamp ${formatMs(ms)} is ${ms === previous ? "the same as" : "before"} the previous row's (line ${rowLines[rowLines.length - 1]}, ${formatMs(previous)}); timestamps must increase`,
      });
      continue;
    }
    let bad = false;
    mapping.columns.forEach((c, j) => {
      const cell = cells[valueIndices[j]!]!;
      const normalised = decimal === "," ? cell.replace(/\s/g, "").replace(",", ".") : cell.replace(/\s/g, "");
      if (!NUMBER.test(normalised)) {
        issues.push({ line: lineNo, column: c.column, message: cell === "" ? "empty cell (a number is needed)" : `"${cell}" is not a number` });
        bad = true;
        return;
      }
      const value = Number(normalised);
      // A value whose square overflows would turn r.m.s./TDD sums into Infinity, which judges as "at the limit".
      if (!(Math.abs(value * c.scale) <= MAX_SAMPLE_MAGNITUDE)) {
        issues.push({
          line: lineNo,
          column: c.column,
          message: `"${cell}" is out of range: magnitudes above ${MAX_SAMPLE_MAGNITUDE.toPrecision(1)} (after the scale) overflow the sums and cannot be judged`,
        });
        bad = true;
        return;
      }
      raw[j]!.push(value);
    });
    if (bad) continue;
    times.push(ms);
    rowLines.push(lineNo);
  }
  if (issues.length > 0) throw new IntervalLogError(issues.slice(0, MAX_ISSUES));
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
        `gap of ${formatS(gap.durationS)} (${gap.missingIntervals} interval${gap.missingIntervals === 1 ? "" : "s"} missing) between line ${rowLines[k]} (${formatMs(times[k]!)}) and line ${rowLines[k + 1]} (${formatMs(times[k + 1]!)}); not bridged`,
      );
    } else if (Math.abs(spacingS - intervalS) > 0.1 * intervalS) irregular += 1;
  });
  if (irregular > 0) warnings.push(`${irregular} row spacing(s) differ from the ${formatS(intervalS)} interval by more than 10 %`);

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
  mapping.columns.forEach((c, j) => {
    const channel = channels.get(c.channel)!;
    const values = Float64Array.from(raw[j]!);
    if (c.kind === "thd") {
      channel.thdPercent = values;
      return;
    }
    if (c.unit === "%") {
      const fundamental = fundamentalOf(c.channel)!;
      for (let k = 0; k < n; k++) values[k] = (values[k]! / 100) * fundamental[k]!;
    } else for (let k = 0; k < n; k++) values[k] = values[k]! * c.scale;
    if (c.kind === "rms") channel.rms = values;
    else channel.orders.set(c.order as number, values);
  });
  for (const channel of channels.values()) {
    if (channel.orders.size === 0 && channel.thdPercent === null) warnings.push(`channel ${channel.name} has no harmonic or THD column`);
  }
  return { intervalS, timestampsMs: Float64Array.from(times), lines: Int32Array.from(rowLines), channels: [...channels.values()], gaps, warnings };
}
