import type { FilterReport } from "./types";

/**
 * What a PCC filter did on one channel, in words for people (the what-if panel and the study pages
 * of the PDF): a passive filter's parallel resonance with the source and its capacitor duty against
 * the IEEE Std 18-2012 limits, an active filter's current and share of its rating. The one place
 * these words are made. O(1).
 *
 * @example describeFilterReport({ kind: "active-filter", ratingUsedA: 42.04, ratingUsedPercent: 42.04 }) // "Active filter: 42.0 A used (42 % of its rating)."
 */
export function describeFilterReport(f: FilterReport): string {
  if (f.kind === "active-filter") return `Active filter: ${f.ratingUsedA?.toFixed(1)} A used (${f.ratingUsedPercent?.toFixed(0)} % of its rating).`;
  const duty = f.capacitorDuty;
  const resonance = `Filter: parallel resonance with the source near order ${f.parallelResonanceOrder?.toFixed(2)}`;
  if (!duty) return `${resonance}.`;
  const { limits } = duty;
  return (
    `${resonance}; capacitor duty rms V ${duty.rmsVoltagePercent.toFixed(0)} %, peak V ${duty.peakVoltagePercent.toFixed(0)} %, ` +
    `rms I ${duty.rmsCurrentPercent.toFixed(0)} %, kvar ${duty.kvarPercent.toFixed(0)} % of rating ` +
    `(IEEE Std 18-2012 limits ${limits.rmsVoltagePercent}/${limits.peakVoltagePercent}/${limits.rmsCurrentPercent}/${limits.kvarPercent} %).`
  );
}
