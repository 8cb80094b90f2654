/** Which values form each aggregation interval; only complete intervals are listed. */
export interface IntervalPlan {
  /** Index of the first value of each complete interval. */
  starts: Int32Array;
  /** Index one past the last value of each complete interval. */
  ends: Int32Array;
  /** Start time of each complete interval, s, in the time base of the input. */
  intervalStartS: Float64Array;
  /** Intervals left out because the record does not cover them fully (edges, gaps). */
  partial: Array<{ startS: number; valueCount: number }>;
}

export type PlanIntervalsOptions =
  | {
      /** Consecutive groups of this many values, e.g. 15 windows of 10/12 cycles = 150/180 cycles (≈ 3 s). */
      groupSize: number;
      valueS: number;
      startsS?: ArrayLike<number>;
    }
  | {
      /** Fixed-duration intervals, e.g. 600 s. */
      intervalS: number;
      valueS: number;
      /** Start of each value, s. Default: k · valueS (gapless from 0). */
      startsS?: ArrayLike<number>;
      /**
       * `clock`: boundaries at whole multiples of intervalS in the time base — with times in seconds
       * since the Unix epoch these are the UTC 10-minute ticks of IEC 61000-4-30 (from memory).
       * `record-start` (default): boundaries at the first value's start + m · intervalS, used when no
       * start timestamp is known.
       */
      align?: "clock" | "record-start";
    };

/**
 * Plan the r.m.s. aggregation of a gapless or gappy series of equal-duration values into longer
 * intervals (IEC 61000-4-30 150/180-cycle and 10-minute values, from memory).
 *
 * Group mode (`groupSize`): consecutive groups from the first value; a trailing group with fewer
 * values, or one straddling a gap, is partial. Interval mode (`intervalS`): each value goes to the
 * interval holding its start time; an interval is complete when its values cover it to within one
 * value's duration (record edges and gaps leave partial intervals, which are listed, not used).
 *
 * Complexity O(n). Throws for non-positive durations or a group size below 1.
 *
 * @example
 * planIntervals(45, { groupSize: 15, valueS: 0.2 }).starts // Int32Array [0, 15, 30]
 */
export function planIntervals(count: number, options: PlanIntervalsOptions): IntervalPlan {
  const { valueS } = options;
  if (!(valueS > 0)) throw new Error("planIntervals requires a positive value duration");
  const startOf = (k: number): number => (options.startsS ? options.startsS[k]! : k * valueS);
  const starts: number[] = [];
  const ends: number[] = [];
  const intervalStartS: number[] = [];
  const partial: IntervalPlan["partial"] = [];

  if ("groupSize" in options) {
    const size = options.groupSize;
    if (!Number.isInteger(size) || size < 1) throw new Error("planIntervals requires a group size of at least 1");
    for (let first = 0; first < count; first += size) {
      const end = Math.min(count, first + size);
      // A group is contiguous when its last value starts (size − 1) durations after its first.
      const contiguous = Math.abs(startOf(end - 1) - startOf(first) - (end - 1 - first) * valueS) <= valueS / 2;
      if (end - first === size && contiguous) {
        starts.push(first);
        ends.push(end);
        intervalStartS.push(startOf(first));
      } else partial.push({ startS: startOf(first), valueCount: end - first });
    }
  } else {
    const { intervalS } = options;
    if (!(intervalS > 0)) throw new Error("planIntervals requires a positive interval duration");
    if (count > 0) {
      const origin = options.align === "clock" ? 0 : startOf(0);
      // Values within a microsecond of a boundary belong to the interval it starts.
      const indexOf = (t: number): number => Math.floor((t - origin) / intervalS + 1e-9);
      let first = 0;
      while (first < count) {
        const m = indexOf(startOf(first));
        let end = first + 1;
        while (end < count && indexOf(startOf(end)) === m) end++;
        const startS = origin + m * intervalS;
        const n = end - first;
        if (n * valueS >= intervalS - valueS * 1.01) {
          starts.push(first);
          ends.push(end);
          intervalStartS.push(startS);
        } else partial.push({ startS, valueCount: n });
        first = end;
      }
    }
  }
  return { starts: Int32Array.from(starts), ends: Int32Array.from(ends), intervalStartS: Float64Array.from(intervalStartS), partial };
}
