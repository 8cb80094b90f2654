// The command line's readable report of an analysis: header, one table per channel, power and sequence.
import type { AnalysisResult, ChannelResult } from "@/lib/analysis/types";

const fmt = (value: number | null | undefined, digits = 4): string =>
  value === null || value === undefined ? "—" : Math.abs(value) >= 1e5 || (Math.abs(value) < 1e-3 && value !== 0) ? value.toExponential(digits - 1) : value.toFixed(digits);

function channelTable(c: ChannelResult): string {
  const lines = [
    `${c.name}  (${c.quantity}, ${c.unit}${c.phase ? `, phase ${c.phase}` : ""})`,
    `  rms ${fmt(c.rms)} ${c.unit}   fundamental ${fmt(c.fundamentalRms)} ${c.unit}   DC ${fmt(c.dc)} ${c.unit}`,
    `  THD(h≤${c.thdMaxOrder}) ${fmt(c.thdPercent, 2)} %   THD40 ${fmt(c.thd40Percent, 2)} %   THD50 ${fmt(c.thd50Percent, 2)} %   PWHD ${fmt(c.pwhdPercent, 2)} %`,
    `  crest factor ${fmt(c.crestFactor, 3)}   K-factor ${fmt(c.kFactor, 2)}   factor K ${fmt(c.factorK, 3)} (e=${c.factorKParameters?.eddyLossRatio}, q=${c.factorKParameters?.exponent})`,
  ];
  if (c.quantity === "current") {
    lines.push(
      `  THC ${fmt(c.thcA)} A   PWHC ${fmt(c.pwhcA)} A` +
        (c.tddPercent !== undefined ? `   TDD ${fmt(c.tddPercent, 2)} %` : "") +
        (c.thcPercentOfIref !== undefined ? `   THC/Iref ${fmt(c.thcPercentOfIref, 2)} %   PWHC/Iref ${fmt(c.pwhcPercentOfIref, 2)} %` : ""),
    );
  }
  lines.push(`  order        rms ${c.unit.padEnd(2)}   % of h1   phase °`);
  for (const h of c.harmonics) {
    lines.push(`  ${String(h.order).padStart(5)}  ${fmt(h.rms).padStart(12)}  ${fmt(h.percentOfFundamental, 2).padStart(8)}  ${fmt(h.phaseDeg, 1).padStart(8)}`);
  }
  return lines.join("\n");
}

/**
 * Renders a result as a readable report: header, one table per channel, power and sequence.
 *
 * @example
 * console.log(formatAnalysisText(result));
 */
export function formatAnalysisText(r: AnalysisResult): string {
  const parts = [
    `fundamental ${r.fundamentalHz.toFixed(4)} Hz (nominal ${r.nominalHz} Hz)   sample interval ${r.sampleIntervalS.toPrecision(6)} s   duration ${r.durationS.toFixed(3)} s`,
    `windows: ${r.window.count} × ${r.window.cycles} cycles resampled to ${r.window.points} points   orders evaluated up to ${r.maxResolvableOrder}`,
    ...r.channels.map(channelTable),
  ];
  if (r.power.phases.length > 0) {
    parts.push(
      [
        "power (displacement factor: + current lags, − current leads)",
        ...r.power.phases.map(
          (p) =>
            `  ${p.voltage} × ${p.current}: P ${fmt(p.activePowerW, 2)} W   S ${fmt(p.apparentPowerVA, 2)} VA   displacement ${fmt(p.displacementFactor)}   distortion ${fmt(p.distortionFactor)}   true PF ${fmt(p.truePowerFactor)}`,
        ),
        ...(r.power.total
          ? [`  total: P ${fmt(r.power.total.activePowerW, 2)} W   S ${fmt(r.power.total.apparentPowerVA, 2)} VA   true PF ${fmt(r.power.total.truePowerFactor)}`]
          : []),
      ].join("\n"),
    );
  }
  for (const s of r.sequence ?? []) {
    const h1 = s.orders[0];
    parts.push(
      `sequence (${s.quantity}: ${s.channels.join(", ")}): fundamental positive ${fmt(h1?.positiveRms)} ${s.unit}, negative ${fmt(h1?.negativeRms)} ${s.unit}, zero ${fmt(h1?.zeroRms)} ${s.unit}, unbalance ${fmt(s.unbalancePercent, 2)} %`,
    );
  }
  if (r.warnings.length > 0) parts.push(["warnings:", ...r.warnings.map((w) => `  - ${w}`)].join("\n"));
  return parts.join("\n\n");
}
