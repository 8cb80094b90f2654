import type { AnalysisResult, ChannelResult } from "../analysis/types";
import { evaluateCompliance, type EvaluateComplianceInput } from "../compliance/evaluate-compliance";
import type { EvaluationContext } from "../compliance/model";
import { diagnoseChannels, type Diagnosis } from "../frontends/diagnose-channels";
import { FRONT_END_MODEL_VERSION, MAX_ORDER } from "../frontends/types";
import { allocateActiveFilter } from "./allocate-active-filter";
import { applyFrontEndChanges } from "./apply-front-end-changes";
import { MitigationInputError } from "./mitigation-input-error";
import { DEFAULT_X_OVER_R, passiveFilterAtPcc } from "./passive-filter-at-pcc";
import type { FilterReport, Mitigation, NetworkData, WhatIfChannel, WhatIfResult } from "./types";

export const WHAT_IF_CAUTION =
  "This is a model prediction, not a measurement: confirm it by measuring after installation. Filter design (resonance, capacitor duty, switching transients) belongs to a qualified engineer under local codes and the utility's requirements.";

/** Below this (fraction of the fundamental) a model order is treated as not produced by the model. */
const MODELLED_ORDER_MIN = 0.005;

export interface WhatIfInput {
  analysis: AnalysisResult;
  mitigations: readonly Mitigation[];
  /** PCC data for a passive filter; missing values are taken from the compliance context. */
  network?: NetworkData;
  /** The limit-set revision and context of the measured sheet, to re-judge the prediction the same way. */
  compliance?: { limitSet: EvaluateComplianceInput["limitSet"]; context: EvaluationContext };
  /** A diagnosis already made (else it is made here). */
  diagnosis?: Diagnosis;
  /** Only this current channel (default: every current channel). */
  channel?: string;
}

const characteristicOrders = (family: string): number[] => {
  const pulses = family === "twelve-pulse" ? 12 : family === "eighteen-pulse" ? 18 : family.startsWith("six-pulse") || family === "thyristor-bridge" ? 6 : 0;
  if (pulses > 0) return Array.from({ length: MAX_ORDER }, (_, k) => k + 1).filter((h) => h > 1 && (h % pulses === 1 || h % pulses === pulses - 1));
  if (family === "single-phase-capacitor" || family === "symmetrical-angle") return Array.from({ length: 24 }, (_, k) => 2 * k + 3);
  return [];
};

/**
 * Predicts the line current of each current channel after the chosen mitigations and re-judges it.
 * Load-side changes (reactor, DC choke, multi-pulse) re-simulate the diagnosed front end; each
 * measured order is scaled by the model's after/before ratio for that order. PCC filters then act on that current: the passive filter by the current
 * divider with the source impedance, the active filter by cancelling orders largest first within
 * its rating. THD/TDD and the verdict follow from the predicted per-order values.
 *
 * @throws MitigationInputError naming a missing input (e.g. a passive filter without Isc or bus voltage)
 * @example buildWhatIfReport({ analysis, mitigations: [{ kind: "reactor", percent: 5 }] }).channels[0]!.thdPercent
 */
export function buildWhatIfReport(input: WhatIfInput): WhatIfResult {
  const { analysis, mitigations } = input;
  const context = input.compliance?.context;
  const busVoltageV = input.network?.busVoltageV ?? context?.busVoltageV;
  const iscA = input.network?.iscA ?? context?.iscA;
  const xOverR = input.network?.xOverR ?? DEFAULT_X_OVER_R;
  const ilA = context?.ilA;
  const assumptions: string[] = [];
  const warnings: string[] = [];
  const currents = analysis.channels.filter((c) => c.quantity === "current" && (input.channel === undefined || c.name === input.channel));
  if (currents.length === 0) throw new MitigationInputError(input.channel === undefined ? "the capture has no current channel" : `no current channel named "${input.channel}"`);
  const hasPassive = mitigations.some((m) => m.kind === "passive-filter");
  if (hasPassive) {
    if (iscA === undefined) throw new MitigationInputError("a passive filter needs the short-circuit current at the PCC (--isc / iscA)");
    if (busVoltageV === undefined) throw new MitigationInputError("a passive filter needs the line-to-line bus voltage at the PCC (--bus-voltage / busVoltageV)");
    if (!(xOverR > 0)) throw new MitigationInputError("the source X/R must be positive");
    assumptions.push(
      `Source impedance from Isc = ${iscA} A at ${busVoltageV} V with X/R = ${xOverR}${input.network?.xOverR === undefined ? " (default)" : ""}; the supply voltage is taken as undistorted, so no background harmonic current flows into the filter.`,
    );
    assumptions.push("Capacitor rated at the bus voltage and the stated kvar; duty limits of IEEE Std 18-2012 (from memory).");
  }
  const diagnosis = input.diagnosis ?? diagnoseChannels(analysis, input.channel);

  assumptions.push(
    `Load-side changes re-simulate the front end the diagnosis found most alike; each measured order is scaled by that model's after/before ratio, and orders the model barely produces (below ${100 * MODELLED_ORDER_MIN} % of fundamental) are kept as measured.`,
  );
  assumptions.push("The fundamental current is taken as unchanged (same load power).");
  if (mitigations.some((m) => m.kind === "multi-pulse")) assumptions.push("Multi-pulse: bridges on ideally phase-shifted windings; the stated imbalance is the difference between bridge currents.");

  const predicted: WhatIfChannel[] = currents.map((channel) => {
    const dx = diagnosis.channels.find((d) => d.name === channel.name);
    const best = dx?.candidates[0];
    if (!best) throw new MitigationInputError(`channel "${channel.name}" carries no fundamental current; there is nothing to predict`);
    const i1 = channel.harmonics.find((h) => h.order === 1)?.rms ?? 0;
    const fe = applyFrontEndChanges({ family: best.family, parameters: best.parameters }, mitigations);
    for (const w of fe.warnings) warnings.push(`${channel.name}: ${w}`);
    if (!dx!.fits && fe.changed) warnings.push(`${channel.name}: no model fits within 5 %, so the load-side prediction is rough`);

    const load = new Map<number, number>();
    for (const h of channel.harmonics) {
      if (h.rms === null || h.order < 2) continue;
      if (!fe.changed || h.order > MAX_ORDER) {
        load.set(h.order, h.rms);
        continue;
      }
      const before = fe.before.magnitude[h.order]!;
      const after = fe.after.magnitude[h.order]!;
      // Scale what the model explains by its after/before ratio (keeps the measurement's own level);
      // an order the model barely produces is something else's (another load, the background): kept.
      load.set(h.order, before >= MODELLED_ORDER_MIN ? h.rms * (after / before) : h.rms);
    }

    const filters: FilterReport[] = [];
    let supply = new Map(load);
    for (const m of mitigations) {
      if (m.kind === "passive-filter") {
        const f = passiveFilterAtPcc({ tuningOrder: m.tuningOrder, kvar: m.kvar, q: m.q, busVoltageV: busVoltageV!, iscA: iscA!, xOverR });
        const next = new Map<number, number>();
        for (const [h, a] of supply) next.set(h, a * f.supplyShare(h));
        const duty = f.capacitorDuty(supply);
        const hp = f.parallelResonanceOrder;
        const characteristic = new Set([...characteristicOrders(best.family), ...[...supply.entries()].filter(([, a]) => i1 > 0 && a / i1 >= 0.01).map(([h]) => h)]);
        const near = [...characteristic].filter((h) => Math.abs(h - hp) <= 0.5).sort((a, b) => a - b);
        if (near.length > 0) warnings.push(`${channel.name}: the ${m.tuningOrder}th filter resonates with the source near order ${hp.toFixed(2)}, within ±0.5 of order ${near.join(", ")} of the load`);
        if (!duty.withinLimits) warnings.push(`${channel.name}: the filter capacitor's duty exceeds IEEE Std 18-2012 limits (rms V ${duty.rmsVoltagePercent.toFixed(0)} %, peak V ${duty.peakVoltagePercent.toFixed(0)} %, rms I ${duty.rmsCurrentPercent.toFixed(0)} %, kvar ${duty.kvarPercent.toFixed(0)} %)`);
        filters.push({ kind: "passive-filter", parallelResonanceOrder: hp, capacitorDuty: duty });
        supply = next;
      } else if (m.kind === "active-filter") {
        const { residualA, ratingUsedA } = allocateActiveFilter(supply, m.ratingA, { from: m.fromOrder, to: m.toOrder });
        filters.push({ kind: "active-filter", ratingUsedA, ratingUsedPercent: (100 * ratingUsedA) / m.ratingA });
        supply = residualA;
      }
    }

    const harmonics = channel.harmonics.map((h) => ({ order: h.order, measuredRms: h.rms, rms: h.order === 1 ? h.rms : h.rms === null ? null : supply.get(h.order) ?? null }));
    const sumSq = (values: Iterable<[number, number | null]>): number => {
      let s = 0;
      for (const [h, a] of values) if (h >= 2 && h <= channel.thdMaxOrder && a !== null) s += a * a;
      return s;
    };
    const predictedSq = sumSq(harmonics.map((h) => [h.order, h.rms]));
    const measuredSq = sumSq(channel.harmonics.map((h) => [h.order, h.rms]));
    return {
      name: channel.name,
      frontEnd: { family: best.family, parameters: best.parameters, description: best.description, fitErrorPercent: best.fitErrorPercent },
      fundamentalA: i1,
      harmonics,
      thdPercent: i1 > 0 ? (100 * Math.sqrt(predictedSq)) / i1 : 0,
      tddPercent: ilA ? (100 * Math.sqrt(predictedSq)) / ilA : null,
      measuredThdPercent: i1 > 0 ? (100 * Math.sqrt(measuredSq)) / i1 : 0,
      measuredTddPercent: ilA ? (100 * Math.sqrt(measuredSq)) / ilA : null,
      filters,
    };
  });

  let compliance = null;
  if (input.compliance) {
    compliance = evaluateCompliance({ analysis: predictedAnalysis(analysis, predicted), limitSet: input.compliance.limitSet, context: input.compliance.context });
  }
  return { prediction: true, modelVersion: FRONT_END_MODEL_VERSION, mitigations: [...mitigations], channels: predicted, compliance, assumptions, warnings, caution: WHAT_IF_CAUTION };
}

/**
 * The analysis with each predicted channel's orders replaced, so the evaluator judges the
 * prediction by the same rules as the measurement: per-window series and IEC 61000-4-7 groups
 * of an order are scaled by that order's predicted/measured ratio.
 */
function predictedAnalysis(analysis: AnalysisResult, channels: readonly WhatIfChannel[]): AnalysisResult {
  return {
    ...analysis,
    channels: analysis.channels.map((c): ChannelResult => {
      const p = channels.find((x) => x.name === c.name);
      if (!p) return c;
      const ratio = new Map<number, number>();
      for (const h of p.harmonics) if (h.rms !== null && h.measuredRms !== null) ratio.set(h.order, h.measuredRms > 0 ? h.rms / h.measuredRms : 1);
      const i1 = p.fundamentalA;
      let totalSq = c.dc * c.dc;
      for (const h of p.harmonics) if (h.rms !== null) totalSq += h.rms * h.rms;
      const thdRatio = c.thdPercent > 0 ? p.thdPercent / c.thdPercent : 1;
      return {
        ...c,
        rms: Math.sqrt(totalSq),
        thdPercent: p.thdPercent,
        ...(c.tddPercent !== undefined && p.tddPercent !== null ? { tddPercent: p.tddPercent } : {}),
        harmonics: c.harmonics.map((h) => {
          const r = ratio.get(h.order) ?? 1;
          const rms = h.rms === null ? null : h.rms * r;
          return { ...h, rms, percentOfFundamental: rms === null || !(i1 > 0) ? h.percentOfFundamental : (100 * rms) / i1, max: h.max == null ? h.max : h.max * r, p95: h.p95 == null ? h.p95 : h.p95 * r };
        }),
        ...(c.harmonicSeries ? { harmonicSeries: c.harmonicSeries.map((s, k) => (s === null ? null : s.map((v) => v * (ratio.get(k + 1) ?? 1)))) } : {}),
        ...(c.groups
          ? {
              groups: c.groups.map((g) => {
                const r = ratio.get(g.order) ?? 1;
                return { ...g, groupRms: g.groupRms === null ? null : g.groupRms * r, subgroupRms: g.subgroupRms === null ? null : g.subgroupRms * r };
              }),
            }
          : {}),
        ...(c.series ? { series: { ...c.series, thdPercent: c.series.thdPercent.map((v) => v * thdRatio) } } : {}),
      };
    }),
  };
}
