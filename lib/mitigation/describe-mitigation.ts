import type { Mitigation } from "./types";

/**
 * One mitigation in words for people (the sheet, the saved-study list, the PDF). The one place
 * these words are made.
 *
 * @example describeMitigation({ kind: "passive-filter", tuningOrder: 4.7, kvar: 300, q: 30 }) // "single-tuned filter at 4.7th, 300 kvar, q 30"
 */
export function describeMitigation(m: Mitigation): string {
  switch (m.kind) {
    case "reactor":
      return `${m.percent} % AC line reactor`;
    case "dc-choke":
      return `${m.percent} % DC choke`;
    case "multi-pulse":
      return `${m.pulses}-pulse conversion (${m.imbalancePercent} % imbalance)`;
    case "passive-filter":
      return `single-tuned filter at ${m.tuningOrder}th, ${m.kvar} kvar, q ${m.q}`;
    case "active-filter":
      return `active filter ${m.ratingA} A (orders ${m.fromOrder}–${m.toOrder})`;
  }
}
