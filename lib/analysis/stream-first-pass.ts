// Pass 1 of the streaming CSV analysis (see analyze-csv-file.ts): parse and check every row, fit the time
// axis, and measure and track the fundamental per segment.
import { ChannelScan } from "./channel-scan";
import type { AnalysisInputError } from "./errors";
import { backwardsTimeError } from "./fit-sample-interval";
import { MemorySink } from "./import-csv";
import { KeptRows } from "./kept-rows";
import { LineFit } from "./line-fit";
import { ROW_CHUNK, RowCollector, type RowSink } from "./row-collector";
import { SegmentEstimator } from "./segment-estimator";
import type { AnalysisHelper, SegmentResults } from "./analysis-helper";

const NO_ROWS = new Float64Array(0);

/** How far ahead of the kept rows the helper thread maps pages: this many chunks, at least this many bytes at a time. */
const PREFAULT_CHUNKS = 4;
const PREFAULT_MIN_BYTES = 64 * 1024;

export interface PendingError {
  row: number;
  error: AnalysisInputError;
}

/**
 * Pass 1 sink. Keeps rows in memory up to the look-ahead (two frequency segments); a file that
 * ends within it is analysed by the in-memory path (identical results). Beyond it, switches to
 * streaming: time-axis fit and monotonic/step checks, per-channel extremes and r.m.s., and the
 * fundamental of each finished segment of the estimation channels, whose phase is then tracked
 * through that segment (the windows' boundaries come from the reference channel's track).
 */
export class FirstPass implements RowSink {
  /** Where the rows are kept: the look-ahead, and the rows kept on for pass 2 (packed, see {@link kept}). */
  private memory: MemorySink | null;
  /**
   * Every row so far, packed into the look-ahead's memory (the look-ahead, then the rows kept on
   * while the record stays within `keepRows` rows: pass 2 then replays them instead of reading the
   * file again). Null once over.
   */
  kept: KeptRows | null;
  streaming = false;
  /** Least-squares line t = start + interval·row over the whole time column. */
  readonly fit = new LineFit();
  firstTimeS = Number.NaN;
  rows = 0;
  readonly scans: ChannelScan[];
  /** Each segment's fundamental and the phase track, per estimation channel (fed segment by segment, as the in-memory path does). */
  private readonly estimator: SegmentEstimator;
  private provisionalRateHz = 0;
  private previousTimeS = Number.NaN;
  monotonicError: PendingError | null = null;
  stepError: { row: number; stepS: number } | null = null;
  /** The look-ahead's samples of the estimation channels (not needed while the helper thread measures from the kept rows). */
  private segmentBuffers: Float64Array[] | null = null;
  private segmentFill = 0;
  /** Segments measured (or sent to be) so far. */
  private segments = 0;
  /** Whether the look-ahead's rows are packed (else kept as doubles until the record outgrows it). */
  private readonly packLookAhead: boolean;
  /** Per kept column (time first), the byte up to which the helper thread was asked to map pages. */
  private readonly prefaulted: number[] = [];
  /** The helper thread measuring the segments from the kept rows, while they are kept. */
  private remote: AnalysisHelper | null = null;
  private remoteResults: Promise<SegmentResults> | null = null;

  constructor(
    private readonly collector: () => RowCollector,
    private readonly channelCount: number,
    private readonly hasTime: boolean,
    /** Indices of the channels whose fundamental is measured (the first voltage, else every current). */
    readonly estimation: number[],
    private readonly segmentSamples: number,
    private readonly statedIntervalS: number | null,
    private readonly timeColumn: number,
    /** Rows to keep for pass 2 at most (0: none); the look-ahead is sized for them (untouched memory costs nothing). */
    private readonly keepRows = 0,
    /** A helper thread to measure the segments in while rows are kept (their channels are then in shared memory). */
    private readonly helper: AnalysisHelper | null = null,
    /**
     * Rows the file is expected to hold (judged from its head): a record expected to outgrow the
     * look-ahead has it packed too; one expected to end within it keeps doubles (for the in-memory path).
     */
    expectedRows = 0,
  ) {
    this.packLookAhead = expectedRows > 2 * segmentSamples;
    const shared = helper !== null && keepRows > 0;
    // Room for 8 bytes per row of the look-ahead and of the rows to be kept (untouched memory costs
    // nothing); the rows are packed into it as they come (KeptRows), so fewer pages are touched.
    this.memory = new MemorySink(channelCount, hasTime, Math.max(2 * segmentSamples + ROW_CHUNK, keepRows), shared);
    this.kept = KeptRows.over(this.memory);
    this.scans = Array.from({ length: channelCount }, () => new ChannelScan());
    this.estimator = new SegmentEstimator(estimation.length);
    // The checks' stores after their loops, run once on no rows (see ChannelScan's constructor).
    this.check(hasTime ? NO_ROWS : null, this.scans.map(() => NO_ROWS), 0, 0);
  }

  accept(timesS: Float64Array | null, values: Float64Array[], count: number, firstRow: number): void {
    this.rows = firstRow + count;
    if (!this.streaming) {
      this.kept!.accept(timesS, values, count, this.packLookAhead);
      this.prefaultKept();
      if (this.rows > 2 * this.segmentSamples && this.channelCount > 0) this.switchToStreaming();
      return;
    }
    if (this.kept) {
      if (this.rows <= this.keepRows) {
        this.kept.accept(timesS, values, count);
        this.prefaultKept();
      } else {
        this.dropKept(firstRow);
      }
    }
    this.stream(timesS, values, count, firstRow);
  }

  /**
   * A chunk of rows packed into the kept columns by the helper thread (RowCollector.addKeptChunk):
   * taken over, then handled as {@link accept} handles rows. Only while rows are kept in shared memory.
   */
  acceptKept(timesS: Float64Array | null, values: Float64Array[], count: number, firstRow: number): void {
    this.rows = firstRow + count;
    if (!this.kept?.shared || this.rows > this.keepRows) throw new Error("FirstPass.acceptKept: rows are not being kept");
    this.kept.adopt(count);
    if (!this.streaming) {
      if (this.rows > 2 * this.segmentSamples && this.channelCount > 0) this.switchToStreaming();
      return;
    }
    this.stream(timesS, values, count, firstRow);
  }

  /** Rows kept for pass 2 at most (0: none). */
  get keptRowsLimit(): number {
    return this.keepRows;
  }

  /** The helper thread is busy with other work (parsing): it is not asked to map pages ahead. */
  prefaultOff = false;

  /**
   * The look-ahead's rows as doubles, for the in-memory analysis of a record that ended within it
   * (unpacked in place: no new memory).
   */
  lookAhead(): MemorySink {
    if (this.streaming) throw new Error("FirstPass.lookAhead: the record outgrew the look-ahead");
    return this.kept!.unpackInPlace(this.memory!);
  }

  private switchToStreaming(): void {
    this.memory = null;
    const kept = this.kept!;
    const keep = this.rows <= this.keepRows;
    this.streaming = true;
    const rows = this.rows;
    // The look-ahead's rows, unpacked chunk by chunk into arrays reused for each.
    const times = kept.times ? new Float64Array(ROW_CHUNK) : null;
    const channels = kept.channels.map(() => new Float64Array(ROW_CHUNK));
    // Provisional rate (the segments' band search only): a fit over the look-ahead, else the stated interval.
    if (times) {
      const fit = new LineFit();
      for (let first = 0; first < rows; first += ROW_CHUNK) {
        const end = Math.min(rows, first + ROW_CHUNK);
        kept.times!.decode(first, end, times);
        for (let r = first; r < end; r++) fit.add(r, times[r - first]!);
      }
      this.provisionalRateHz = 1 / fit.slope();
    } else {
      this.provisionalRateHz = this.statedIntervalS ? 1 / this.statedIntervalS : 0;
    }
    if (!(this.provisionalRateHz > 0 && Number.isFinite(this.provisionalRateHz))) this.provisionalRateHz = 0;
    if (keep && this.helper) {
      // The helper thread measures the segments from the kept rows.
      this.remote = this.helper;
    } else {
      this.segmentBuffers = this.estimation.map(() => new Float64Array(2 * this.segmentSamples));
    }
    for (let first = 0; first < rows; first += ROW_CHUNK) {
      const end = Math.min(rows, first + ROW_CHUNK);
      if (times) kept.times!.decode(first, end, times);
      kept.channels.forEach((column, c) => column.decode(first, end, channels[c]!));
      this.stream(times, channels, end - first, first);
    }
    if (!keep) this.kept = null;
  }

  /**
   * Has the helper thread map the pages the kept rows will fill next (a few chunks ahead, at the
   * bytes per row the last chunk packed into), while this thread parses on.
   */
  private prefaultKept(): void {
    if (!this.kept?.shared || !this.helper || this.prefaultOff) return;
    const pages: Float64Array[] = [];
    this.kept.forEachColumn((column, c) => {
      const from = Math.max(column.usedBytes, this.prefaulted[c] ?? 0);
      const to = Math.min(column.bytes.byteLength, column.usedBytes + PREFAULT_CHUNKS * column.lastChunkBytes);
      if (to - from >= PREFAULT_MIN_BYTES) {
        pages.push(new Float64Array(column.bytes, from, (to - from) / 8));
        this.prefaulted[c] = to;
      }
    });
    if (pages.length > 0) this.helper.prefault(pages);
  }

  private stream(timesS: Float64Array | null, values: Float64Array[], count: number, firstRow: number): void {
    this.check(timesS, values, count, firstRow);
    this.segmentsFrom(values, count);
  }

  /** Time-axis fit and checks, and each channel's extremes and sum of squares. */
  private check(timesS: Float64Array | null, values: Float64Array[], count: number, firstRow: number): void {
    if (timesS && this.hasTime) {
      if (firstRow === 0 && count > 0) this.firstTimeS = timesS[0]!;
      for (let r = 0; r < count; r++) this.fit.add(firstRow + r, timesS[r]!);
      const intervalS = 1 / this.provisionalRateHz;
      let previous = this.previousTimeS;
      for (let r = 0; r < count; r++) {
        const t = timesS[r]!;
        if (r + firstRow > 0) {
          if (t < previous && !this.monotonicError) {
            const row = firstRow + r;
            const line = this.collector().lineOfRow(row);
            this.monotonicError = { row, error: backwardsTimeError(line, this.timeColumn, t, previous) };
          }
          // Provisional: against the look-ahead's interval; re-checked exactly in pass 2.
          if (!this.stepError && Math.abs(t - previous - intervalS) > 0.5 * intervalS) this.stepError = { row: firstRow + r, stepS: t - previous };
        }
        previous = t;
      }
      this.previousTimeS = previous;
    }
    for (let c = 0; c < this.channelCount; c++) this.scans[c]!.add(values[c]!, count);
  }

  /** Fills the look-ahead of the segments and measures (or sends) each segment as it is complete. */
  private segmentsFrom(values: Float64Array[], count: number): void {
    let offset = 0;
    while (offset < count) {
      const take = Math.min(count - offset, 2 * this.segmentSamples - this.segmentFill);
      const buffers = this.segmentBuffers;
      if (buffers) {
        for (let e = 0; e < this.estimation.length; e++) buffers[e]!.set(values[this.estimation[e]!]!.subarray(offset, offset + take), this.segmentFill);
      }
      this.segmentFill += take;
      offset += take;
      // A full look-ahead means its first segment is not the last one (the last takes the remainder).
      if (this.segmentFill === 2 * this.segmentSamples) {
        this.estimate(this.segmentSamples, false);
        if (buffers) for (const buffer of buffers) buffer.copyWithin(0, this.segmentSamples, this.segmentFill);
        this.segmentFill -= this.segmentSamples;
      }
    }
  }

  /** Measures the next segment, here or (its samples being kept in shared memory) in the helper thread. */
  private estimate(length: number, last: boolean): void {
    const start = this.segments * this.segmentSamples;
    if (this.remote) {
      const results = this.remote.sendSegment({
        channels: this.estimation.map((e) => this.kept!.channels[e]!.data),
        provisionalRateHz: this.provisionalRateHz,
        start,
        length,
        first: this.segments === 0,
        last,
      });
      if (results) {
        // Awaited by segmentResults(); an input error thrown before then must not leave it unhandled.
        results.catch(() => undefined);
        this.remoteResults = results;
      }
    } else {
      // No usable rate yet (no interval stated, or a broken time axis): the error is reported after pass 1.
      this.estimator.estimate(this.segmentBuffers!, length, this.provisionalRateHz);
    }
    this.segments++;
  }

  /**
   * The record outgrew the rows it may keep (its size was misjudged from its head): the helper
   * thread, which reads the kept rows, is let go and the segments it was sent are measured here
   * from the rows kept so far (the same numbers), and the look-ahead refilled from them.
   */
  private dropKept(firstRow: number): void {
    const kept = this.kept!;
    this.kept = null;
    if (!this.remote) return;
    this.remote = null;
    const channels = this.estimation.map((e) => kept.channelRows(e, 0, firstRow));
    for (let k = 0; k < this.segments; k++) {
      const start = k * this.segmentSamples;
      this.estimator.estimate(
        channels.map((c) => c.subarray(start, start + this.segmentSamples)),
        this.segmentSamples,
        this.provisionalRateHz,
      );
    }
    const from = this.segments * this.segmentSamples;
    this.segmentBuffers = channels.map((c) => {
      const buffer = new Float64Array(2 * this.segmentSamples);
      buffer.set(c.subarray(from, firstRow));
      return buffer;
    });
  }

  /** The last segment: whatever the look-ahead holds at the end (one to two segments). */
  end(): void {
    if (this.streaming && this.segmentFill > 0) this.estimate(this.segmentFill, true);
  }

  /** True when the helper thread measured the segments (its time ran alongside this thread's). */
  get segmentsMeasuredElsewhere(): boolean {
    return this.remoteResults !== null;
  }

  /** Every segment's fundamental (f / provisional rate, or the channel's error), the phase tracks and the time spent, per estimation channel (after {@link end}). */
  async segmentResults(): Promise<SegmentResults> {
    if (this.remoteResults) return this.remoteResults;
    const { ratios, trackers, fundamentalMs } = this.estimator;
    return { ratios, tracks: trackers.map((t) => t.finish()), fundamentalMs };
  }
}
