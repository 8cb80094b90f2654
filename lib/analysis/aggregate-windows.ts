// The whole-capture aggregation of the windows a WindowAnalyzer has taken in (see window-analyzer.ts).
import { computeIndices } from "./indices";
import type { pairPhases } from "./pair-phases";
import { pairPower } from "./power";
import { summarizeWindows } from "./summarize-windows";
import type { AnalysisOptions, ChannelResult, HarmonicGroupValue, HarmonicValue, PowerPhase, SequenceSet } from "./types";
import type { ChannelState, WindowAggregate, WindowShape } from "./window-types";

/** A channel whose mean DC exceeds this fraction of its fundamental r.m.s. gets a warning. */
const DC_WARNING_FRACTION = 0.02;

/** What the analyzer has accumulated over its windows, read by {@link aggregateWindows}. */
export interface WindowTotals {
  channels: ChannelState[];
  /** Orders per window in the per-window arrays (orders + 1). */
  stride: number;
  pairs: ReturnType<typeof pairPhases>["pairs"];
  sets: ReturnType<typeof pairPhases>["sets"];
  pairActive: Float64Array;
  pairProduct: { re: number; im: number }[];
  sequenceSq: { pos: Float64Array; neg: Float64Array; zero: Float64Array }[];
  shape: WindowShape;
  windowCount: number;
}

/**
 * Aggregates the windows added so far into channel results (r.m.s. mean, maximum, 95th
 * percentile per order; indices; per-window series), power per phase pair and sequence sets.
 * Pushes DC-offset warnings onto `warnings`.
 *
 * Complexity O(channels · orders · W log W) for the percentiles.
 */
export function aggregateWindows(totals: WindowTotals, options: AnalysisOptions, warnings: string[]): WindowAggregate {
  const { channels, stride, pairs, sets, pairActive, pairProduct, sequenceSq, windowCount } = totals;
  const { orders, maxOrder, resolvableOrder, thdMaxOrder } = totals.shape;
  const eddyLossRatio = options.factorKEddyLossRatio ?? 0.1;
  const exponent = options.factorKExponent ?? 1.7;
  const meanRoot = (sumSq: number): number => Math.sqrt(sumSq / windowCount);
  // Per order 1…maxOrder, the r.m.s. over the windows of each named sum of squares; null above the resolvable order.
  const rmsByOrder = <K extends string>(sums: Record<K, Float64Array>) =>
    Array.from({ length: maxOrder }, (_, i) => {
      const h = i + 1;
      const values = Object.fromEntries(Object.entries<Float64Array>(sums).map(([key, sq]) => [key, h <= resolvableOrder ? meanRoot(sq[h]!) : null]));
      return { order: h, ...values } as { order: number } & Record<K, number | null>;
    });
  const results: ChannelResult[] = channels.map((ch) => {
    const unit = ch.quantity === "current" ? "A" : "V";
    const aggregated = new Float64Array(stride);
    const harmonics: HarmonicValue[] = [];
    for (let h = 1; h <= orders; h++) {
      if (h > resolvableOrder) {
        if (h <= maxOrder) harmonics.push({ order: h, rms: null, phaseDeg: null, percentOfFundamental: null, max: null, p95: null });
        continue;
      }
      const summary = summarizeWindows(ch.orderRms, h, stride, windowCount);
      aggregated[h] = summary.rmsMean;
      if (h <= maxOrder) {
        harmonics.push({
          order: h,
          rms: summary.rmsMean,
          phaseDeg: (Math.atan2(ch.phasorSumIm[h]!, ch.phasorSumRe[h]!) * 180) / Math.PI,
          percentOfFundamental: 0,
          max: summary.max,
          p95: summary.p95,
        });
      }
    }
    const fundamentalRms = aggregated[1]!;
    for (const value of harmonics) {
      if (value.rms !== null) value.percentOfFundamental = fundamentalRms > 0 ? (100 * value.rms) / fundamentalRms : 0;
    }
    const indices = computeIndices(aggregated, {
      resolvableOrder,
      thdMaxOrder,
      eddyLossRatio,
      exponent,
      ...(ch.quantity === "current" && options.ilA !== undefined ? { ilA: options.ilA } : {}),
      ...(ch.quantity === "current" && options.irefA !== undefined ? { irefA: options.irefA } : {}),
    });
    let dcSum = 0;
    let crestSum = 0;
    let sumSquares = 0;
    let peak = 0;
    for (let w = 0; w < windowCount; w++) {
      dcSum += ch.orderRms[w * stride]!;
      const rms = ch.windowRms[w]!;
      sumSquares += rms * rms;
      crestSum += rms > 0 ? ch.windowPeak[w]! / rms : 0;
      if (ch.windowPeak[w]! > peak) peak = ch.windowPeak[w]!;
    }
    const rms = meanRoot(sumSquares);
    const dc = dcSum / windowCount;
    if (Math.abs(dc) > DC_WARNING_FRACTION * fundamentalRms) {
      warnings.push(`channel ${ch.name}: DC offset of ${dc.toPrecision(3)} ${unit} (${((100 * Math.abs(dc)) / fundamentalRms).toFixed(1)} % of the fundamental)`);
    }
    const groups: HarmonicGroupValue[] = rmsByOrder({
      groupRms: ch.groupSq,
      subgroupRms: ch.subgroupSq,
      interharmonicGroupRms: ch.interGroupSq,
      interharmonicSubgroupRms: ch.interSubgroupSq,
    });
    const result: ChannelResult = {
      name: ch.name,
      quantity: ch.quantity,
      unit,
      phase: ch.phase,
      rms,
      dc,
      fundamentalRms,
      thdPercent: indices.thdPercent,
      thdMaxOrder: indices.thdMaxOrder,
      crestFactor: crestSum / windowCount,
      kFactor: indices.kFactor,
      harmonics,
      thd40Percent: indices.thd40Percent,
      thd50Percent: indices.thd50Percent,
      factorK: indices.factorK,
      factorKParameters: { eddyLossRatio, exponent, maxOrder: indices.kMaxOrder },
      peak,
      scale: ch.scale,
      groups,
      series: {
        rms: Array.from(ch.windowRms.subarray(0, windowCount)),
        thdPercent: Array.from(ch.windowThd.subarray(0, windowCount)),
        fundamentalRms: Array.from({ length: windowCount }, (_, w) => ch.orderRms[w * stride + 1]!),
      },
    };
    if (indices.pwhdPercent !== null) result.pwhdPercent = indices.pwhdPercent;
    if (ch.quantity === "current") {
      result.thcA = indices.thcA;
      if (indices.pwhcA !== null) result.pwhcA = indices.pwhcA;
      if (indices.tddPercent !== undefined) result.tddPercent = indices.tddPercent;
      if (indices.thcPercentOfIref !== undefined) result.thcPercentOfIref = indices.thcPercentOfIref;
      if (indices.pwhcPercentOfIref !== undefined) result.pwhcPercentOfIref = indices.pwhcPercentOfIref;
    }
    if (options.includeOrderSeries) {
      result.harmonicSeries = Array.from({ length: maxOrder }, (_, i) =>
        i + 1 > resolvableOrder ? null : Array.from({ length: windowCount }, (_, w) => ch.orderRms[w * stride + i + 1]!),
      );
    }
    return result;
  });

  const phases: PowerPhase[] = pairs.map((pair, p) => {
    const v = results[pair.voltage]!;
    const i = results[pair.current]!;
    const power = pairPower({
      activePowerW: pairActive[p]! / windowCount,
      voltageRms: v.rms,
      currentRms: i.rms,
      currentFundamentalRms: i.fundamentalRms,
      fundamentalProduct: pairProduct[p]!,
    });
    return { voltage: v.name, current: i.name, phase: pair.phase, ...power };
  });
  let total: WindowAggregate["power"]["total"] = null;
  if (phases.length >= 2) {
    const activePowerW = phases.reduce((s, p) => s + p.activePowerW, 0);
    const apparentPowerVA = phases.reduce((s, p) => s + p.apparentPowerVA, 0);
    total = { activePowerW, apparentPowerVA, truePowerFactor: apparentPowerVA > 0 ? activePowerW / apparentPowerVA : 0 };
  }

  const sequence: SequenceSet[] = sets.map((set, s) => {
    const acc = sequenceSq[s]!;
    const positive = meanRoot(acc.pos[1]!);
    return {
      quantity: set.quantity,
      unit: set.quantity === "current" ? "A" : "V",
      channels: [results[set.a]!.name, results[set.b]!.name, results[set.c]!.name],
      unbalancePercent: positive > 0 ? (100 * meanRoot(acc.neg[1]!)) / positive : 0,
      orders: rmsByOrder({ positiveRms: acc.pos, negativeRms: acc.neg, zeroRms: acc.zero }),
    };
  });


    return { channels: results, power: { phases, total }, sequence };
}
