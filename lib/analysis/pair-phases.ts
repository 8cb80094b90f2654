// Forms voltage–current pairs per phase and recognises three-phase sets.
import type { Quantity } from "./types";

/** The fields pairing needs from a channel. */
export interface PairableChannel {
  quantity: Quantity;
  phase: string | null;
}

/** Indices into the channel list. */
export interface PhasePairing {
  pairs: { voltage: number; current: number; phase: string | null }[];
  sets: { quantity: Quantity; a: number; b: number; c: number }[];
}

/**
 * Pairs each phase's voltage with its current (a with a, b with b, c with c); a file with one
 * voltage and one current and no phase labels gives one pair. A quantity with exactly one
 * channel for each of phases a, b and c is a three-phase set (used for sequence components).
 *
 * Complexity O(channels).
 *
 * @example
 * pairPhases([{ quantity: "voltage", phase: "a" }, { quantity: "current", phase: "a" }])
 * // { pairs: [{ voltage: 0, current: 1, phase: "a" }], sets: [] }
 */
export function pairPhases(channels: readonly PairableChannel[]): PhasePairing {
  const pick = (quantity: Quantity, phase: string | null): number[] =>
    channels.flatMap((c, i) => (c.quantity === quantity && c.phase === phase ? [i] : []));
  const pairs: PhasePairing["pairs"] = [];
  const sets: PhasePairing["sets"] = [];
  for (const phase of ["a", "b", "c"]) {
    const v = pick("voltage", phase);
    const i = pick("current", phase);
    if (v.length === 1 && i.length === 1) pairs.push({ voltage: v[0]!, current: i[0]!, phase });
  }
  if (pairs.length === 0) {
    const v = channels.flatMap((c, i) => (c.quantity === "voltage" ? [i] : []));
    const i = channels.flatMap((c, k) => (c.quantity === "current" ? [k] : []));
    if (v.length === 1 && i.length === 1) pairs.push({ voltage: v[0]!, current: i[0]!, phase: null });
  }
  for (const quantity of ["voltage", "current"] as const) {
    const [a, b, c] = [pick(quantity, "a"), pick(quantity, "b"), pick(quantity, "c")];
    if (a.length === 1 && b.length === 1 && c.length === 1) sets.push({ quantity, a: a[0]!, b: b[0]!, c: c[0]! });
  }
  return { pairs, sets };
}
