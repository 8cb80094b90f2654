// Per-channel set-up of an evaluation: harmonics by order, derived Iref and λ, and the time
// base and series the time rules are evaluated on.
import type { AnalysisResult, ChannelResult } from "../analysis/types";
import type { ChannelContext, ChannelTimeSeries, EvaluateComplianceInput } from "./evaluation-types";
import { formatNumber as fmt } from "./format-number";
import type { Basis, EvaluationContext, LimitSetRevisionContent } from "./model";
import type { TimeBasis } from "./result";

/** The time base and series of one channel for the revision's time rules; null when it has none. */
function channelTimeSeries(analysis: AnalysisResult, channel: ChannelResult, content: LimitSetRevisionContent, input: EvaluateComplianceInput): ChannelTimeSeries | null {
  const rules = content.rules.timeRules ?? [];
  if (rules.length === 0) return null;
  const logged = input.timeSeries;
  if (logged) {
    const series = logged.channels[channel.name];
    const startsS = logged.startsS;
    const n = startsS.length;
    const durationS = n > 0 ? startsS[n - 1]! + logged.valueS - startsS[0]! : 0;
    return {
      rules,
      timing: n > 0 ? { source: "interval-log", valueS: logged.valueS, startsS, clockKnown: true, plans: {} } : null,
      unavailable: n > 0 ? undefined : { code: "no-logged-rows" },
      captureMeanFallback: false,
      orderSeries: (h) => series?.orders.get(h) ?? null,
      fundamental: series?.orders.get(1) ?? null,
      thdPercent: series?.thdPercent ?? null,
      basis: {
        source: "interval-log",
        valueS: logged.valueS,
        valueCount: n,
        durationS,
        startMs: n > 0 ? startsS[0]! * 1000 : null,
        snapshotFallback: false,
        coverage: "none",
      },
    };
  }
  const windowS = analysis.window.cycles / analysis.fundamentalHz;
  const series = channel.harmonicSeries;
  const count = series?.find((values) => values !== null)?.length ?? 0;
  const startMs = input.recordStartMs ?? null;
  const basis: TimeBasis = {
    source: series && count > 0 ? "windows" : "none",
    valueS: windowS,
    valueCount: count,
    durationS: count * windowS,
    startMs,
    snapshotFallback: true,
    coverage: "none",
  };
  if (!series || count === 0) {
    return {
      rules,
      timing: null,
      unavailable: { code: "no-order-series" },
      captureMeanFallback: true,
      orderSeries: () => null,
      fundamental: null,
      thdPercent: null,
      basis,
    };
  }
  const offsetS = startMs === null ? 0 : startMs / 1000;
  const startsS = Float64Array.from({ length: count }, (_, k) => offsetS + k * windowS);
  const cache = new Map<number, Float64Array | null>();
  const orderSeries = (h: number): Float64Array | null => {
    if (!cache.has(h)) {
      const values = series[h - 1];
      cache.set(h, values && values.length === count ? Float64Array.from(values) : null);
    }
    return cache.get(h) ?? null;
  };
  return {
    rules,
    timing: { source: "windows", valueS: windowS, startsS, clockKnown: startMs !== null, plans: {} },
    captureMeanFallback: true,
    orderSeries,
    fundamental: orderSeries(1),
    thdPercent: null,
    basis,
  };
}

/**
 * The facts one channel is judged with: its harmonics by order, Iref and λ (measured when the
 * context does not give them, with a note), and its time series. O(orders).
 *
 * @example
 * channelContext(analysis, analysis.channels[0], content, {}, input).irefA // measured r.m.s. current, A
 */
export function channelContext(
  analysis: AnalysisResult,
  channel: ChannelResult,
  content: LimitSetRevisionContent,
  context: EvaluationContext,
  input: EvaluateComplianceInput,
): ChannelContext {
  const harmonics = new Map(channel.harmonics.map((harmonic) => [harmonic.order, harmonic]));
  const notes: string[] = [];
  const usesBasis = (basis: Basis): boolean =>
    content.bands.some((band) => band.orderRows.some((row) => row.basis === basis) || band.aggregates.some((aggregate) => aggregate.basis === basis));
  const usesLambda = content.bands.some((band) => band.orderRows.some((row) => row.formula?.includes("lambda")));

  let irefA = context.irefA;
  if (irefA === undefined && usesBasis("%Iref") && channel.rms > 0) {
    // IEC 61000-3-12: Iref is the measured average r.m.s. input current unless a value is declared.
    irefA = channel.rms;
    notes.push(`Iref = measured r.m.s. current ${fmt(channel.rms)} A (no Iref given)`);
  }
  let lambda = context.lambda;
  if (lambda === undefined && usesLambda) {
    const phase = analysis.power.phases.find((candidate) => candidate.current === channel.name);
    if (phase) {
      // IEC 61000-3-2: λ is the measured circuit power factor P / (U·I) (from memory).
      lambda = phase.truePowerFactor;
      notes.push(`λ = measured true power factor ${fmt(phase.truePowerFactor)} of ${phase.voltage} × ${phase.current} (no λ given)`);
    }
  }
  const orders = channel.harmonics.map((harmonic) => harmonic.order);
  return {
    channel,
    harmonics,
    analysedUpTo: orders.length > 0 ? Math.max(...orders) : 0,
    maxResolvableOrder: analysis.maxResolvableOrder,
    content,
    context,
    lambda,
    irefA,
    notes,
    time: channelTimeSeries(analysis, channel, content, input),
    record: input.timeSeries ? "interval-log" : "analysis",
    windowCount: analysis.window.count,
  };
}
