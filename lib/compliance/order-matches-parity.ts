import type { Parity } from "./model";

/**
 * Whether harmonic order `h` belongs to a row's parity class.
 *
 * (`triplen` means odd multiples of 3.) O(1).
 *
 * @example
 * orderMatchesParity(9, "non-triplen-odd") // false
 */
export function orderMatchesParity(h: number, parity: Parity): boolean {
  switch (parity) {
    case "all":
      return true;
    case "odd":
      return h % 2 === 1;
    case "even":
      return h % 2 === 0;
    case "triplen":
      return h % 2 === 1 && h % 3 === 0;
    case "non-triplen-odd":
      return h % 2 === 1 && h % 3 !== 0;
  }
}
