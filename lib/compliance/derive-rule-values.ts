// Turns a per-value series (analysis windows or logged intervals) into the values a time rule
// takes its statistic over: window values, 1.5 s smoothed values, 3 s values or 10-minute values.
import { aggregateIntervals } from "../analysis/aggregate-intervals";
import { planIntervals, type IntervalPlan } from "../analysis/plan-intervals";
import { smoothFirstOrder } from "../analysis/smooth-first-order";
import type { NotEvaluatedCause } from "./result";

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

export type RuleValues = { ok: true; values: Float64Array; startsS: Float64Array; valueS: number } | { ok: false; cause: NotEvaluatedCause };

const close = (a: number, b: number): boolean => Math.abs(a - b) <= 0.01 * b;

/**
 * The values a time rule with `intervalS` (0 window, 1.5 smoothed, 3, 600) needs, derived from a
 * series on `timing`; or why they cannot be derived (a cause code) (e.g. smoothing needs window values, not a
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
  const needsOther: RuleValues = { ok: false, cause: { code: "needs-other-values", intervalS, loggedValueS: valueS } };
  if (intervalS === 0 || intervalS === 1.5) {
    if (timing.source !== "windows") {
      return needsOther;
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
    return needsOther;
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
  return needsOther;
}
