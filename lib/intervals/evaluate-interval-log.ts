import type { AnalysisResult, ChannelResult, HarmonicValue } from "../analysis/types";
import { evaluateCompliance, type EvaluateComplianceInput, type TimeSeriesInput } from "../compliance/evaluate-compliance";
import type { Basis, EvaluationContext } from "../compliance/model";
import { CAPTURE_MEAN_RULE, type ComplianceResult, type ComplianceRow } from "../compliance/result";
import { fundamentalSeries } from "./fundamental-series";
import { thinIntervalTrends } from "./thin-interval-trends";
import type { IntervalGap, IntervalLog, IntervalTrend, IntervalTrendSeries } from "./types";

export type { IntervalTrend, IntervalTrendSeries } from "./types";

export interface IntervalLogEvaluation extends ComplianceResult {
  trends: IntervalTrend[];
  log: { intervalS: number; rowCount: number; startMs: number; endMs: number; gaps: IntervalGap[]; warnings: string[] };
}

function rmsOf(values: ArrayLike<number>): number {
  let sum = 0;
  for (let k = 0; k < values.length; k++) sum += values[k]! * values[k]!;
  return values.length > 0 ? Math.sqrt(sum / values.length) : 0;
}

function basisFactor(basis: Basis, context: EvaluationContext, irefA: number | undefined): number | null {
  switch (basis) {
    case "A":
    case "mA/W":
      return 1;
    case "%IL":
      return context.ilA ? 100 / context.ilA : null;
    case "%Iref":
      return irefA ? 100 / irefA : null;
    case "%Vnom":
      return context.nominalVoltageV ? 100 / context.nominalVoltageV : null;
    default:
      return null; // %I1 / %V1: per row
  }
}

function toBasisValues(values: Float64Array, basis: Basis, fundamental: Float64Array | null, context: EvaluationContext, irefA: number | undefined): number[] | null {
  if (basis === "%I1" || basis === "%V1") {
    if (!fundamental) return null;
    return Array.from(values, (v, k) => (fundamental[k]! > 0 ? (v / fundamental[k]!) * 100 : 0));
  }
  const factor = basisFactor(basis, context, irefA);
  return factor === null ? null : Array.from(values, (v) => v * factor);
}

function ruleLimitsOf(row: { rowRules?: ComplianceRow["rowRules"] }): IntervalTrendSeries["ruleLimits"] {
  return (row.rowRules ?? [])
    .filter((result) => result.rule !== CAPTURE_MEAN_RULE && result.tableLimit !== null)
    .map((result) => ({ rule: result.rule, label: result.label, limit: (result.tableLimit as number) * result.multiplier }));
}

/**
 * Evaluate an imported interval log against a limit-set revision: the revision's time rules run
 * over the whole logged period (e.g. IEEE 519 weekly 95th/99th percentiles of 10-minute values,
 * 1,008 rows per channel for a week), on the same evaluator as captures, so the result has the
 * ComplianceResult shape (rows with rowRules, aggregates, verdict, timeRules summary) plus
 * trend series per channel (orders and THD/TDD in the unit of their limits, with the table limit
 * and each rule's limit; thinned to `options.maxTrendPoints`, default ~2,000, per series by
 * thinIntervalTrends) and the log's gaps and warnings.
 *
 * There is no capture mean to fall back on: a rule the log cannot serve (3 s values from a
 * 10-minute log, 1.5 s smoothing) is not evaluated and named; rows none of whose rules can be
 * evaluated are `not-evaluated`. Orders not in the log are `not-evaluated` ("not in the interval
 * log"); THD/TDD use the logged THD column when not every order is logged.
 * Complexity O(channels × orders × rows). Throws as evaluateCompliance does.
 *
 * @example
 * const result = evaluateIntervalLog(log, { key, name, revision, content }, { iscA: 20000, ilA: 500, busVoltageV: 480 });
 * result.rows.find((row) => row.order === 5)?.decidedBy // "weekly-p95-short"
 */
export function evaluateIntervalLog(
  log: IntervalLog,
  limitSet: EvaluateComplianceInput["limitSet"],
  context: EvaluationContext,
  options: { channel?: string; maxTrendPoints?: number } = {},
): IntervalLogEvaluation {
  const rowCount = log.timestampsMs.length;
  const fundamentals = new Map(log.channels.map((channel) => [channel.name, fundamentalSeries(channel)]));
  const channels: ChannelResult[] = log.channels.map((channel) => {
    const fundamental = fundamentals.get(channel.name) ?? null;
    const fundamentalRms = fundamental ? rmsOf(fundamental) : 0;
    const orders = [...channel.orders.keys()].filter((order) => order > 1).sort((a, b) => a - b);
    const harmonics: HarmonicValue[] = [
      { order: 1, rms: fundamentalRms, phaseDeg: null, percentOfFundamental: 100 },
      ...orders.map((order) => {
        const rms = rmsOf(channel.orders.get(order)!);
        return { order, rms, phaseDeg: null, percentOfFundamental: fundamentalRms > 0 ? (rms / fundamentalRms) * 100 : null };
      }),
    ];
    const distortion = Math.sqrt(harmonics.slice(1).reduce((sum, h) => sum + (h.rms ?? 0) ** 2, 0));
    const rms = channel.rms ? rmsOf(channel.rms) : Math.sqrt(fundamentalRms ** 2 + distortion ** 2);
    return {
      name: channel.name,
      quantity: channel.quantity,
      unit: channel.unit,
      phase: null,
      rms,
      dc: 0,
      fundamentalRms,
      thdPercent: channel.thdPercent ? rmsOf(channel.thdPercent) : fundamentalRms > 0 ? (distortion / fundamentalRms) * 100 : 0,
      thdMaxOrder: 50,
      crestFactor: Number.NaN,
      kFactor: Number.NaN,
      harmonics,
    };
  });
  const durationS = rowCount > 0 ? (log.timestampsMs[rowCount - 1]! - log.timestampsMs[0]!) / 1000 + log.intervalS : 0;
  const analysis: AnalysisResult = {
    fundamentalHz: 50,
    nominalHz: 50,
    sampleIntervalS: log.intervalS,
    durationS,
    window: { cycles: 10, points: 0, count: rowCount },
    maxResolvableOrder: 100,
    channels,
    power: { phases: [], total: null },
    warnings: log.warnings,
  };
  const timeSeries: TimeSeriesInput = {
    source: "interval-log",
    valueS: log.intervalS,
    startsS: Float64Array.from(log.timestampsMs, (ms) => ms / 1000),
    channels: Object.fromEntries(
      log.channels.map((channel) => {
        const orders = new Map(channel.orders);
        const fundamental = fundamentals.get(channel.name);
        if (fundamental && !orders.has(1)) orders.set(1, fundamental);
        return [channel.name, { orders, ...(channel.thdPercent ? { thdPercent: channel.thdPercent } : {}) }];
      }),
    ),
  };
  const result = evaluateCompliance({ analysis, limitSet, context, timeSeries, ...(options.channel ? { channel: options.channel } : {}) });
  if (log.gaps.length > 0) {
    const missing = log.gaps.reduce((sum, gap) => sum + gap.missingIntervals, 0);
    result.notes.push(`the log has ${log.gaps.length} gap(s) (${missing} interval(s) missing); statistics use the logged intervals only — gaps are not bridged`);
  }

  const timestampsMs = Array.from(log.timestampsMs);
  const trends: IntervalTrend[] = result.channels.map((evaluated) => {
    const channel = log.channels.find((candidate) => candidate.name === evaluated.channel)!;
    const fundamental = fundamentals.get(channel.name) ?? null;
    const irefA = evaluated.derived.irefA ?? context.irefA;
    const orders: IntervalTrendSeries[] = [];
    for (const row of evaluated.rows) {
      const values = channel.orders.get(row.order);
      if (!values) continue;
      const inBasis = toBasisValues(values, row.basis, fundamental, context, irefA);
      if (!inBasis) continue;
      const tableLimit = row.rowRules?.find((result) => result.tableLimit !== null)?.tableLimit ?? null;
      orders.push({ name: `h${row.order}`, order: row.order, unit: row.unit, values: inBasis, limit: tableLimit, ruleLimits: ruleLimitsOf(row) });
    }
    const aggregates: IntervalTrendSeries[] = [];
    for (const aggregate of evaluated.aggregates) {
      if (aggregate.name !== "THD" && aggregate.name !== "TDD") continue;
      let distortion: Float64Array | null = null;
      if (channel.thdPercent && fundamental) distortion = Float64Array.from(channel.thdPercent, (thd, k) => (thd / 100) * fundamental[k]!);
      else if (channel.orders.size > 1) {
        distortion = new Float64Array(rowCount);
        for (const [order, values] of channel.orders) if (order >= 2 && order <= 50) for (let k = 0; k < rowCount; k++) distortion[k] = distortion[k]! + values[k]! ** 2;
        for (let k = 0; k < rowCount; k++) distortion[k] = Math.sqrt(distortion[k]!);
      }
      const inBasis = distortion ? toBasisValues(distortion, aggregate.basis, fundamental, context, irefA) : null;
      if (!inBasis) continue;
      const tableLimit = aggregate.rowRules?.find((result) => result.tableLimit !== null)?.tableLimit ?? null;
      aggregates.push({ name: aggregate.name, unit: aggregate.unit, values: inBasis, limit: tableLimit, ruleLimits: ruleLimitsOf(aggregate) });
    }
    // Thinned per channel as built, so a long log's full-resolution series never exist for every channel at once.
    return thinIntervalTrends([{ channel: evaluated.channel, timestampsMs, orders, aggregates }], options.maxTrendPoints)[0]!;
  });
  return {
    ...result,
    trends,
    log: {
      intervalS: log.intervalS,
      rowCount,
      startMs: log.timestampsMs[0] ?? 0,
      endMs: rowCount > 0 ? log.timestampsMs[rowCount - 1]! + log.intervalS * 1000 : 0,
      gaps: log.gaps,
      warnings: log.warnings,
    },
  };
}
