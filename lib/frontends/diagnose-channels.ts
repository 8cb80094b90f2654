import type { AnalysisResult } from "../analysis/types";
import { describeCandidate } from "./describe-candidate";
import { FAMILY_LABELS } from "./family-labels";
import { fitFamily } from "./fit-family";
import { measuredSpectrum } from "./measured-spectrum";
import { FRONT_END_FAMILIES, FRONT_END_MODEL_VERSION, type FrontEndFamily, type FrontEndParameters } from "./types";

/** A fit error above this is "no model fits". */
export const GOOD_FIT_PERCENT = 5;

export interface DiagnosisCandidate {
  family: FrontEndFamily;
  parameters: FrontEndParameters;
  /** % of the fundamental. */
  fitErrorPercent: number;
  description: string;
}

export interface ChannelDiagnosis {
  name: string;
  /** Best first, at most three (none when the channel carries no fundamental current). */
  candidates: DiagnosisCandidate[];
  /** Whether the best candidate fits within GOOD_FIT_PERCENT. */
  fits: boolean;
  /** One sentence for people (resemblance, or "no model fits within 5 %"). */
  summary: string;
  /** Whether the phase pattern was taken relative to a voltage channel. */
  usedVoltage: boolean;
}

export interface Diagnosis {
  modelVersion: string;
  channels: ChannelDiagnosis[];
}

/**
 * Which converter front end does each current channel's spectrum resemble? Fits every family
 * (lib/frontends/families.ts) to orders 2–50 relative to the fundamental (and the phase pattern;
 * the displacement when a voltage channel is paired), ranks by fit error and keeps the best three.
 * A resemblance for an engineer to confirm, never a statement of what is installed.
 *
 * @param analysis an analysed capture
 * @param channelName only this current channel (default: every current channel)
 * @example diagnoseChannels(analysis).channels[0]!.candidates[0]!.family // "six-pulse-capacitor"
 */
export function diagnoseChannels(analysis: AnalysisResult, channelName?: string): Diagnosis {
  const currents = analysis.channels.filter((c) => c.quantity === "current" && (channelName === undefined || c.name === channelName));
  if (channelName !== undefined && currents.length === 0) throw new Error(`no current channel named "${channelName}"`);
  const channels = currents.map((channel): ChannelDiagnosis => {
    const fundamental = channel.harmonics.find((h) => h.order === 1)?.rms ?? null;
    if (fundamental === null || !(fundamental > 0)) {
      return { name: channel.name, candidates: [], fits: false, summary: "No fundamental current was measured, so there is no spectrum to compare.", usedVoltage: false };
    }
    const measured = measuredSpectrum(analysis, channel);
    const fits = FRONT_END_FAMILIES.map((family) => fitFamily(measured, family)).sort((a, b) => a.fitErrorPercent - b.fitErrorPercent);
    const candidates = fits.slice(0, 3).map((fit) => ({
      family: fit.family,
      parameters: roundParameters(fit.parameters),
      fitErrorPercent: Math.round(fit.fitErrorPercent * 100) / 100,
      description: describeCandidate(fit.family, fit.parameters, measured.hasVoltage),
    }));
    const best = candidates[0]!;
    const good = best.fitErrorPercent <= GOOD_FIT_PERCENT;
    const summary = good
      ? `The spectrum ${best.description} (fit error ${best.fitErrorPercent.toFixed(1)} % of fundamental).`
      : `No model fits within ${GOOD_FIT_PERCENT} % (best: ${FAMILY_LABELS[best.family]}, ${best.fitErrorPercent.toFixed(1)} % of fundamental); the load may be a mix of front ends.`;
    return { name: channel.name, candidates, fits: good, summary, usedVoltage: measured.hasVoltage };
  });
  return { modelVersion: FRONT_END_MODEL_VERSION, channels };
}

function roundParameters(p: FrontEndParameters): FrontEndParameters {
  const out: FrontEndParameters = {};
  for (const [k, v] of Object.entries(p)) out[k] = Math.round(v * 1000) / 1000;
  return out;
}
