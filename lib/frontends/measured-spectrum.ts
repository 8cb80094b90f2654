import type { AnalysisResult, ChannelResult } from "../analysis/types";
import type { MeasuredSpectrum } from "./spectrum-distance";
import { MAX_ORDER } from "./types";

/**
 * The measured spectrum of one current channel, relative to its fundamental, with phases relative
 * to the voltage it is paired with in the analysis's power pairs (same phase label, or the only
 * voltage channel). Without a pair, phases are kept only as a waveform shape.
 *
 * @throws when the channel has no fundamental
 * @example measuredSpectrum(analysis, analysis.channels[1]!).magnitude[5]
 */
export function measuredSpectrum(analysis: AnalysisResult, channel: ChannelResult): MeasuredSpectrum {
  const fundamental = channel.harmonics.find((h) => h.order === 1);
  if (!fundamental || fundamental.rms === null || !(fundamental.rms > 0)) throw new Error(`channel "${channel.name}" has no fundamental current to compare with`);
  const pair = analysis.power.phases.find((phase) => phase.current === channel.name);
  const voltage = pair ? analysis.channels.find((c) => c.name === pair.voltage) : undefined;
  const voltagePhaseDeg = voltage?.harmonics.find((h) => h.order === 1)?.phaseDeg ?? null;
  const magnitude = new Float64Array(MAX_ORDER + 1).fill(Number.NaN);
  const phaseRad = new Float64Array(MAX_ORDER + 1).fill(Number.NaN);
  let maxOrder = 1;
  const ref = voltagePhaseDeg ?? 0;
  for (const h of channel.harmonics) {
    if (h.order < 1 || h.order > MAX_ORDER || h.rms === null) continue;
    magnitude[h.order] = h.rms / fundamental.rms;
    if (h.phaseDeg !== null) phaseRad[h.order] = ((h.phaseDeg - h.order * ref) * Math.PI) / 180;
    maxOrder = Math.max(maxOrder, h.order);
  }
  return { magnitude, phaseRad, maxOrder, hasVoltage: voltagePhaseDeg !== null };
}
