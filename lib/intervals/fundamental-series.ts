import type { IntervalLogChannel } from "./types";

/**
 * An interval-log channel's fundamental per row: the logged order 1, else r.m.s. / √(1 + (THD/100)²)
 * per row when both are logged (the definition THD = √(I² − I1²) / I1 solved for I1); null otherwise.
 * O(rows).
 *
 * @example fundamentalSeries({ orders: new Map(), rms: Float64Array.of(50), thdPercent: Float64Array.of(75), … })?.[0] // 40
 */
export function fundamentalSeries(channel: Pick<IntervalLogChannel, "orders" | "rms" | "thdPercent">): Float64Array | null {
  const logged = channel.orders.get(1);
  if (logged) return logged;
  if (!channel.rms || !channel.thdPercent) return null;
  const out = new Float64Array(channel.rms.length);
  for (let k = 0; k < out.length; k++) out[k] = channel.rms[k]! / Math.sqrt(1 + (channel.thdPercent[k]! / 100) ** 2);
  return out;
}
