"use client";

import { useMemo } from "react";
import { SpectrumChart } from "@/app/_components/charts/spectrum-chart";
import { VerdictBadge } from "@/app/_components/verdict-badge";
import type { EvaluationContext } from "@/lib/compliance/model";
import type { ChannelCompliance } from "@/lib/compliance/result";
import { describeFilterReport } from "@/lib/mitigation/describe-filter-report";
import { describeMitigation } from "@/lib/mitigation/describe-mitigation";
import type { WhatIfResult } from "@/lib/mitigation/types";
import { formatNumber } from "@/lib/reports/format";
import { predictionLimits } from "@/lib/reports/prediction-limits";

/** A prediction beside the measurement: verdict, THD/TDD, both spectra, the per-order table, filter reports, warnings and assumptions, marked as a prediction. */
export function PredictionView({ result, channel, context }: { result: WhatIfResult; channel: ChannelCompliance; context: EvaluationContext }) {
  const predictedChannel = result.channels.find((c) => c.name === channel.channel) ?? result.channels[0];
  const predictedRows = result.compliance?.channels.find((c) => c.channel === channel.channel)?.rows ?? [];
  const charts = useMemo(() => {
    if (!predictedChannel) return null;
    const i1 = predictedChannel.fundamentalA;
    const dto = (pick: "measuredRms" | "rms") => ({
      name: predictedChannel.name,
      quantity: "current" as const,
      unit: "A",
      harmonics: predictedChannel.harmonics.map((h) => ({ order: h.order, rms: h[pick], percentOfFundamental: h[pick] === null || !(i1 > 0) ? null : (100 * h[pick]!) / i1 })),
      series: null,
      harmonicSeries: null,
    });
    return { measured: dto("measuredRms"), predicted: dto("rms") };
  }, [predictedChannel]);
  if (!predictedChannel || !charts) return null;
  const measuredByOrder = new Map(channel.rows.map((r) => [r.order, r]));
  const predictedByOrder = new Map(predictedRows.map((r) => [r.order, r]));
  // One unit per column: the table limit in amperes and, where the table states it in another unit, that unit.
  const limits = predictionLimits(channel.rows, { fundamentalA: predictedChannel.fundamentalA, irefA: channel.derived.irefA, context });
  const orders = predictedChannel.harmonics.filter((h) => h.order >= 2 && (measuredByOrder.get(h.order)?.limit != null || (h.measuredRms ?? 0) > 0.01 * predictedChannel.fundamentalA));
  return (
    <div className="mt-4 space-y-3" data-testid="prediction">
      <p className="rounded-md border border-caution/40 bg-caution-light px-3 py-2 font-semibold text-caution" data-testid="prediction-label">
        PREDICTION — {result.mitigations.map(describeMitigation).join(" + ")}
      </p>
      <div className="flex flex-wrap items-center gap-3">
        <span>Predicted verdict:</span>
        {result.compliance ? <VerdictBadge verdict={result.compliance.verdict} size="lg" testId="prediction-verdict" /> : <span className="text-ink-muted">not judged (no evaluation)</span>}
        <span className="text-ink-soft">
          THD {predictedChannel.measuredThdPercent.toFixed(1)} % → {predictedChannel.thdPercent.toFixed(1)} %
          {predictedChannel.tddPercent !== null && predictedChannel.measuredTddPercent !== null && ` · TDD ${predictedChannel.measuredTddPercent.toFixed(1)} % → ${predictedChannel.tddPercent.toFixed(1)} %`}
        </span>
      </div>
      <div className="grid gap-3 lg:grid-cols-2">
        <div>
          <h3 className="mb-1 text-ink-soft">Measured</h3>
          <SpectrumChart channel={charts.measured} rows={channel.rows} mode="amperes" />
        </div>
        <div>
          <h3 className="mb-1 text-ink-soft">Predicted</h3>
          <SpectrumChart channel={charts.predicted} rows={predictedRows} mode="amperes" />
        </div>
      </div>
      <table className="w-full text-left" data-testid="prediction-table">
        <thead className="text-ink-muted">
          <tr>
            <th className="py-1 pr-2">Order</th>
            <th className="py-1 pr-2 text-right">Measured (A)</th>
            <th className="py-1 pr-2 text-right">Predicted (A)</th>
            <th className="py-1 pr-2 text-right">Table limit (A)</th>
            {limits.unit !== "A" && <th className="py-1 pr-2 text-right">Table limit ({limits.unit})</th>}
            <th className="py-1">Verdict measured → predicted</th>
          </tr>
        </thead>
        <tbody>
          {orders.map((h) => {
            const m = measuredByOrder.get(h.order);
            const p = predictedByOrder.get(h.order);
            return (
              <tr key={h.order} className="border-t border-line" data-testid={`prediction-row-${h.order}`}>
                <td className="py-1 pr-2">{h.order}</td>
                <td className="py-1 pr-2 text-right tabular-nums">{formatNumber(h.measuredRms, 3)}</td>
                <td className="py-1 pr-2 text-right tabular-nums">{formatNumber(h.rms, 3)}</td>
                <td className="py-1 pr-2 text-right tabular-nums">{formatNumber(limits.tableLimitA(m), 3)}</td>
                {limits.unit !== "A" && <td className="py-1 pr-2 text-right tabular-nums">{formatNumber(limits.tableLimit(m), 3)}</td>}
                <td className="py-1">
                  {m ? <VerdictBadge verdict={m.verdict} /> : "—"} → {p ? <VerdictBadge verdict={p.verdict} /> : "—"}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
      {predictedChannel.filters.map((f, k) => (
        <p key={k} className="text-ink-soft">
          {describeFilterReport(f)}
        </p>
      ))}
      {result.warnings.length > 0 && (
        <ul className="list-disc pl-5 text-caution" data-testid="prediction-warnings">
          {result.warnings.map((w) => <li key={w}>{w}</li>)}
        </ul>
      )}
      <details className="text-ink-soft">
        <summary className="cursor-pointer">Assumptions</summary>
        <ul className="list-disc pl-5">
          {result.assumptions.map((a) => <li key={a}>{a}</li>)}
        </ul>
      </details>
      <p className="text-ink-muted" data-testid="prediction-caution">{result.caution}</p>
    </div>
  );
}
