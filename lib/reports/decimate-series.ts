// Per-order window series for the trend charts, cut to a payload a phone can draw.
import { smoothFirstOrder } from "@/lib/analysis/smooth-first-order";

export interface DecimatedOrderSeries {
  order: number;
  /** Window r.m.s. values; with more windows than points, the largest of each group (so excursions stay visible). */
  rms: number[];
  /** The 1.5 s smoothed values (IEC 61000-4-7 filter over every window), grouped the same way. */
  smoothed: number[];
}

export interface DecimatedSeries {
  /** Windows behind each point (1 = not decimated). */
  windowsPerPoint: number;
  windowCount: number;
  orders: DecimatedOrderSeries[];
  /** Mean fundamental per point (for % of I1 limits); null when the analysis kept none. */
  fundamental: number[] | null;
}

const round = (x: number) => (Number.isFinite(x) ? Number(x.toPrecision(5)) : 0);

function group(values: ArrayLike<number>, size: number, pick: "max" | "mean"): number[] {
  const out: number[] = [];
  for (let start = 0; start < values.length; start += size) {
    const end = Math.min(values.length, start + size);
    let acc = pick === "max" ? -Infinity : 0;
    for (let k = start; k < end; k++) acc = pick === "max" ? Math.max(acc, values[k]!) : acc + values[k]!;
    out.push(round(pick === "max" ? acc : acc / (end - start)));
  }
  return out;
}

/**
 * The per-window series of the chosen orders (harmonicSeries[order − 1][window]) decimated to at
 * most `maxPoints` points, with the 1.5 s smoothed series computed on every window before
 * grouping (smoothing a decimated series would not match the evaluator). Orders without a
 * series are left out. Complexity O(orders × windows).
 *
 * @example
 * decimateSeries([[10, 10], [1, 2]], [2], 0.2).orders[0].rms // [1, 2]
 */
export function decimateSeries(harmonicSeries: ReadonlyArray<number[] | null>, orders: number[], windowS: number, maxPoints = 600): DecimatedSeries {
  const windowCount = harmonicSeries.find((s) => s !== null)?.length ?? 0;
  const size = Math.max(1, Math.ceil(windowCount / maxPoints));
  const out: DecimatedOrderSeries[] = [];
  for (const order of [...new Set(orders)].sort((a, b) => a - b)) {
    const values = harmonicSeries[order - 1];
    if (!values || values.length !== windowCount || windowCount === 0) continue;
    out.push({ order, rms: group(values, size, "max"), smoothed: group(smoothFirstOrder(values, windowS), size, "max") });
  }
  const fundamental = harmonicSeries[0] && harmonicSeries[0].length === windowCount && windowCount > 0 ? group(harmonicSeries[0], size, "mean") : null;
  return { windowsPerPoint: size, windowCount, orders: out, fundamental };
}
