/**
 * Which orders of a from..to range a row covers. `triplen` = odd multiples of 3 (3, 9, 15, …,
 * the usual power-system meaning); `non-triplen-odd` = odd and not a multiple of 3. The list
 * lives here (not in model.ts) so the model imports this file and not the other way round.
 */
export const PARITIES = ["all", "odd", "even", "triplen", "non-triplen-odd"] as const;
export type Parity = (typeof PARITIES)[number];

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
