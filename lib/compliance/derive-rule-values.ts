// Turns a per-value series (analysis windows or logged intervals) into the values a time rule
// takes its statistic over: window values, 1.5 s smoothed values, 3 s values or 10-minute values.
import { aggregateIntervals } from "../analysis/aggregate-intervals";
import { planIntervals, type IntervalPlan } from "../analysis/plan-intervals";
import { smoothFirstOrder } from "../analysis/smooth-first-order";

/** The time base of a channel's series. */
export interface TimeSeriesTiming {
  /** `windows`: 10/12-cycle analysis windows; `interval-log`: values logged by an analyser. */
  source: "windows" | "interval-log";
  /** Duration of one value, s. */
  valueS: number;
  /** Start of each value, s — since the epoch when `clockKnown`, else since the record start. */
  startsS: Float64Array;
  clockKnown: boolean;
  /** Interval plans, computed once per timing and shared by every order of the channel. */
  plans: { veryShort?: IntervalPlan; short?: IntervalPlan };
}

export type RuleValues = { ok: true; values: Float64Array; startsS: Float64Array; valueS: number } | { ok: false; reason: string };

const close = (a: number, b: number): boolean => Math.abs(a - b) <= 0.01 * b;

/** "600 s" → "10 min", 86400 → "24 h", 2.04 → "2.04 s". */
export function formatDurationS(seconds: number): string {
  if (seconds >= 86_400 && Number.isInteger(seconds / 86_400)) return seconds / 86_400 === 7 ? "7 days" : `${seconds / 3600} h`;
  if (seconds >= 3600) {
    const h = Math.floor(seconds / 3600);
    const min = Math.round((seconds - h * 3600) / 60);
    return min === 0 ? `${h} h` : `${h} h ${min} min`;
  }
  if (seconds >= 60) {
    const min = Math.floor(seconds / 60);
    const s = Math.round(seconds - min * 60);
    return s === 0 ? `${min} min` : `${min} min ${s} s`;
  }
  return `${Number(seconds.toPrecision(3))} s`;
}

/**
 * The values a time rule with `intervalS` (0 window, 1.5 smoothed, 3, 600) needs, derived from a
 * series on `timing`; or why they cannot be derived (e.g. smoothing needs window values, not a
 * 10-minute log). 3 s values are 15 consecutive 10/12-cycle windows (150/180 cycles) or logged
 * 3 s values; 10-minute values are the r.m.s. of the windows (or of shorter logged values that
 * divide 10 min) in each complete interval, clock-aligned when the start time is known
 * (IEC 61000-4-30, from memory). Complexity O(n).
 *
 * @example
 * deriveRuleValues(windowValues, 3, timing) // { ok: true, values: 3 s values, … }
 */
export function deriveRuleValues(values: ArrayLike<number>, intervalS: 0 | 1.5 | 3 | 600, timing: TimeSeriesTiming): RuleValues {
  const { valueS, startsS } = timing;
  const logged = `the interval log holds ${formatDurationS(valueS)} values`;
  if (intervalS === 0 || intervalS === 1.5) {
    if (timing.source !== "windows") {
      return { ok: false, reason: `needs 10/12-cycle window values${intervalS === 1.5 ? " (for the 1.5 s smoothing)" : ""}; ${logged}` };
    }
    const out = intervalS === 0 ? Float64Array.from(values) : smoothFirstOrder(values, valueS);
    return { ok: true, values: out, startsS, valueS };
  }
  if (intervalS === 3) {
    if (timing.source === "windows") {
      timing.plans.veryShort ??= planIntervals(values.length, { groupSize: 15, valueS, startsS });
      const plan = timing.plans.veryShort;
      return { ok: true, values: aggregateIntervals(values, plan), startsS: plan.intervalStartS, valueS: valueS * 15 };
    }
    if (close(valueS, 3)) return { ok: true, values: Float64Array.from(values), startsS, valueS };
    return { ok: false, reason: `needs 3 s (150/180-cycle) values; ${logged}` };
  }
  if (timing.source === "interval-log" && close(valueS, 600)) return { ok: true, values: Float64Array.from(values), startsS, valueS };
  const divides = Math.abs(600 / valueS - Math.round(600 / valueS)) < 1e-6;
  if (timing.source === "windows" || (valueS < 600 && divides)) {
    timing.plans.short ??= planIntervals(values.length, {
      intervalS: 600,
      valueS,
      startsS,
      align: timing.clockKnown ? "clock" : "record-start",
    });
    const plan = timing.plans.short;
    return { ok: true, values: aggregateIntervals(values, plan), startsS: plan.intervalStartS, valueS: 600 };
  }
  return { ok: false, reason: `needs 10-minute values (or shorter values that divide 10 min); ${logged}` };
}
