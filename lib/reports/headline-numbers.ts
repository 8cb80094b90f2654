// The numbers a reader looks at first, per channel, per V–I pair and for the three-phase total.
import type { AnalysisResult, ChannelResult, IntervalChannelStatistics, IntervalLogStatistics, IntervalValueStatistics, Quantity, SequenceSet } from "@/lib/analysis/types";
import type { EvaluationContext } from "@/lib/compliance/model";

export interface HeadlineChannel {
  name: string;
  quantity: Quantity;
  /** "A" or "V". */
  unit: string;
  /** "a" | "b" | "c", or null for a single channel. */
  phase: string | null;
  fundamentalHz: number;
  rms: number | null;
  fundamentalRms: number | null;
  thdPercent: number | null;
  /** Highest order included in THD. */
  thdMaxOrder: number | null;
  /** Currents only, when IL was given: total demand distortion, % of IL. */
  tddPercent: number | null;
  /** The IL TDD is taken against, A. */
  ilA: number | null;
  crestFactor: number | null;
  kFactor: number | null;
}

export type LeadLag = "lagging" | "leading" | "in phase";

export interface HeadlinePower {
  /** A V–I pair ("pair") or the three-phase total ("total"). */
  kind: "pair" | "total";
  voltage: string | null;
  current: string | null;
  phase: string | null;
  activePowerW: number;
  apparentPowerVA: number;
  /** |cos θ1| of the fundamentals; `leadLag` says which way the current is shifted. */
  displacementFactor: number | null;
  leadLag: LeadLag | null;
  /** I1 / Irms (pairs); √ΣI1² / √ΣIrms² over the phases (total). */
  distortionFactor: number | null;
  /** P / S; negative when power flows towards the source. */
  truePowerFactor: number;
}

export interface HeadlineUnbalance {
  quantity: Quantity;
  channels: [string, string, string];
  /** Negative-sequence / positive-sequence fundamental, %. */
  unbalancePercent: number;
}

/** An interval-log channel's logged statistics, with TDD (% of IL) where IL was given. */
export interface HeadlineIntervalChannel extends IntervalChannelStatistics {
  /** The distortion's statistics over IL, % (currents with a distortion and an IL only). */
  tddPercent: IntervalValueStatistics | null;
}

/** An interval log's headline numbers: what its columns say over the logged period. */
export interface HeadlineIntervalLog {
  intervalS: number;
  rowCount: number;
  startMs: number;
  endMs: number;
  /** The IL TDD is taken against, A; null when none was given. */
  ilA: number | null;
  channels: HeadlineIntervalChannel[];
}

export interface HeadlineNumbers {
  fundamentalHz: number;
  channels: HeadlineChannel[];
  power: HeadlinePower[];
  unbalance: HeadlineUnbalance[];
  /** Interval logs only: their logged statistics (they have no waveform, so no channels, power or unbalance). */
  intervalLog?: HeadlineIntervalLog;
}

/**
 * The part of an analysis the headline numbers read: a whole AnalysisResult fits, and so does the slim
 * summary the sheet loads (no per-order or per-window arrays).
 */
export interface HeadlineSource {
  fundamentalHz: number;
  channels: Array<
    Pick<ChannelResult, "name" | "quantity" | "unit" | "phase" | "rms" | "fundamentalRms" | "thdPercent" | "thdMaxOrder" | "crestFactor" | "kFactor" | "tddPercent">
  >;
  power: AnalysisResult["power"];
  sequence?: Array<Pick<SequenceSet, "quantity" | "channels" | "unbalancePercent">>;
  /** An interval log's logged statistics (interval logs have no channels of their own). */
  intervalLog?: IntervalLogStatistics | null;
}

const finite = (x: number | null | undefined): number | null => (typeof x === "number" && Number.isFinite(x) ? x : null);

function leadLagOf(angleDeg: number | null | undefined): LeadLag | null {
  if (angleDeg === null || angleDeg === undefined || !Number.isFinite(angleDeg)) return null;
  if (Math.abs(angleDeg) < 1e-9) return "in phase";
  // Positive angle (voltage fundamental minus current fundamental): the current lags.
  return angleDeg > 0 ? "lagging" : "leading";
}

/**
 * The headline numbers of a stored analysis, as plain data for the sheet, the share page, the PDF
 * (page 1) and the CSV: per channel the fundamental frequency (Hz), r.m.s. and fundamental r.m.s.
 * (A or V), THD with its upper order, TDD against IL (currents, when IL is in the evaluation
 * context), crest factor and K-factor; per V–I pair P (W), S (VA), displacement factor with
 * lead/lag, distortion factor and true power factor; for a three-phase set the total, with
 * displacement factor ΣP1/ΣS1 (P1 = V1·I1·cos θ1, S1 = V1·I1 per phase; IEEE 1459-2010 §3.2 defines
 * the per-phase terms) and distortion factor √ΣI1²/√ΣIrms²; and the fundamental unbalance of each
 * recognised three-phase set. Values the engine could not compute (NaN, stored as null) are null.
 * An interval log (no waveform) has instead its logged statistics per channel (`intervalLog`: r.m.s.
 * mean, 95th percentile and maximum of the logged r.m.s., fundamental, THD and distortion, and TDD
 * against the context's IL). Null when there is no analysis. O(channels + pairs).
 *
 * @example
 * headlineNumbers(analysis, { ilA: 260 })?.channels[0]?.tddPercent // 7.4
 */
export function headlineNumbers(analysis: HeadlineSource | null | undefined, context: EvaluationContext | Record<string, unknown>): HeadlineNumbers | null {
  if (!analysis) return null;
  const ilA = finite((context as EvaluationContext).ilA);
  const byName = new Map(analysis.channels.map((c) => [c.name, c]));
  const channels: HeadlineChannel[] = analysis.channels.map((c) => {
    // TDD is stated only with the IL it is taken against (the pipeline passes the context IL to the engine).
    const tdd = c.quantity === "current" && ilA !== null ? finite(c.tddPercent) : null;
    return {
      name: c.name,
      quantity: c.quantity,
      unit: c.unit,
      phase: c.phase ?? null,
      fundamentalHz: analysis.fundamentalHz,
      rms: finite(c.rms),
      fundamentalRms: finite(c.fundamentalRms),
      thdPercent: finite(c.thdPercent),
      thdMaxOrder: finite(c.thdMaxOrder),
      tddPercent: tdd,
      ilA: tdd !== null ? ilA : null,
      crestFactor: finite(c.crestFactor),
      kFactor: finite(c.kFactor),
    };
  });

  const phases = analysis.power?.phases ?? [];
  const power: HeadlinePower[] = phases.map((p) => ({
    kind: "pair",
    voltage: p.voltage,
    current: p.current,
    phase: p.phase ?? null,
    activePowerW: p.activePowerW,
    apparentPowerVA: p.apparentPowerVA,
    displacementFactor: finite(Math.abs(p.displacementFactor)),
    leadLag: leadLagOf(p.displacementAngleDeg ?? (p.displacementFactor < 0 ? -1 : 1)),
    distortionFactor: finite(p.distortionFactor),
    truePowerFactor: p.truePowerFactor,
  }));

  const total = analysis.power?.total;
  if (total && phases.length > 1) {
    let p1 = 0;
    let q1 = 0;
    let s1 = 0;
    let i1Squared = 0;
    let iSquared = 0;
    let complete = true;
    for (const p of phases) {
      const v = byName.get(p.voltage);
      const i = byName.get(p.current);
      const angle = p.displacementAngleDeg;
      if (!v || !i || angle === undefined || !Number.isFinite(angle)) {
        complete = false;
        continue;
      }
      const s = v.fundamentalRms * i.fundamentalRms;
      s1 += s;
      p1 += s * Math.cos((angle * Math.PI) / 180);
      q1 += s * Math.sin((angle * Math.PI) / 180);
      i1Squared += i.fundamentalRms ** 2;
      iSquared += i.rms ** 2;
    }
    power.push({
      kind: "total",
      voltage: null,
      current: null,
      phase: null,
      activePowerW: total.activePowerW,
      apparentPowerVA: total.apparentPowerVA,
      displacementFactor: complete && s1 > 0 ? Math.abs(p1) / s1 : null,
      leadLag: complete && s1 > 0 ? leadLagOf((Math.atan2(q1, p1) * 180) / Math.PI) : null,
      distortionFactor: complete && iSquared > 0 ? Math.sqrt(i1Squared / iSquared) : null,
      truePowerFactor: total.truePowerFactor,
    });
  }

  const unbalance: HeadlineUnbalance[] = (analysis.sequence ?? [])
    .filter((s) => Number.isFinite(s.unbalancePercent))
    .map((s) => ({ quantity: s.quantity, channels: s.channels, unbalancePercent: s.unbalancePercent }));

  const log = analysis.intervalLog;
  const intervalLog: HeadlineIntervalLog | undefined = log
    ? {
        intervalS: log.intervalS,
        rowCount: log.rowCount,
        startMs: log.startMs,
        endMs: log.endMs,
        ilA,
        channels: log.channels.map((c) => ({
          ...c,
          // TDD = distortion / IL with IL constant: each statistic of TDD is that of the distortion over IL.
          tddPercent:
            c.quantity === "current" && c.distortion && ilA !== null && ilA > 0
              ? { ...c.distortion, rmsMean: (c.distortion.rmsMean / ilA) * 100, p95: (c.distortion.p95 / ilA) * 100, max: (c.distortion.max / ilA) * 100 }
              : null,
        })),
      }
    : undefined;

  return { fundamentalHz: analysis.fundamentalHz, channels, power, unbalance, ...(intervalLog ? { intervalLog } : {}) };
}
