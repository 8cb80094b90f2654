"use client";

import { useMemo } from "react";
import type uPlot from "uplot";
import type { EvaluationContext } from "@/lib/compliance/model";
import type { ComplianceRow } from "@/lib/compliance/result";
import type { DecimatedSeries } from "@/lib/reports/decimate-series";
import { formatMultiplier, tableLimitOf } from "@/lib/reports/time-rules";
import { axisStyle, UPlotChart } from "./uplot-chart";
import { formatNumber } from "@/lib/reports/format";

/**
 * Window values (channel unit) in the row's unit, value by value as the evaluator does: % of I1
 * against each value's own fundamental, other percentages against a fixed reference. Null when the
 * reference is missing.
 */
export function toRowUnit(values: number[], row: Pick<ComplianceRow, "basis">, fundamental: number[] | null, refs: { ilA?: number; irefA?: number; nominalVoltageV?: number }): number[] | null {
  switch (row.basis) {
    case "A":
    case "mA/W":
      return values;
    case "%I1":
    case "%V1":
      return fundamental && fundamental.length === values.length ? values.map((v, k) => (fundamental[k]! > 0 ? (v / fundamental[k]!) * 100 : 0)) : null;
    case "%IL":
      return refs.ilA ? values.map((v) => (v / refs.ilA!) * 100) : null;
    case "%Iref":
      return refs.irefA ? values.map((v) => (v / refs.irefA!) * 100) : null;
    case "%Vnom":
      return refs.nominalVoltageV ? values.map((v) => (v / refs.nominalVoltageV!) * 100) : null;
  }
}

/**
 * One order over the record: its window values, the 1.5 s smoothed values when a rule uses them,
 * and horizontal lines at the table limit and at each rule's limit × multiplier.
 */
export function OrderTrendChart({
  series,
  row,
  windowDurationS,
  context,
  irefA,
  showSmoothed,
}: {
  series: DecimatedSeries;
  row: ComplianceRow;
  windowDurationS: number;
  context: EvaluationContext;
  irefA?: number;
  showSmoothed: boolean;
}) {
  const built = useMemo(() => {
    const orderSeries = series.orders.find((o) => o.order === row.order);
    if (!orderSeries || orderSeries.rms.length === 0) return { error: "No per-window values for this order." } as const;
    const refs = { ilA: context.ilA, irefA: irefA ?? context.irefA, nominalVoltageV: context.nominalVoltageV };
    const values = toRowUnit(orderSeries.rms, row, series.fundamental, refs);
    const smoothed = showSmoothed ? toRowUnit(orderSeries.smoothed, row, series.fundamental, refs) : null;
    if (!values) return { error: `The values cannot be shown in ${row.unit} (a reference value is missing).` } as const;
    const step = series.windowsPerPoint * windowDurationS;
    const times = values.map((_, i) => i * step + windowDurationS / 2);
    const tableLimit = tableLimitOf(row);
    const multipliers = [...new Set((row.rowRules ?? []).map((r) => r.multiplier).filter((m) => m !== 1))].sort((a, b) => a - b);
    const fmt = (v: number | null | undefined) => (v == null ? "—" : `${formatNumber(v)} ${row.unit}`);
    const many = values.length >= 40;
    const uSeries: uPlot.Series[] = [
      { label: "t (s)", value: (_u, v) => (v == null ? "—" : v.toFixed(2)) },
      { label: series.windowsPerPoint > 1 ? "window values (max per point)" : "window values", stroke: "#3c4b5e", width: 1.4, points: { show: !many, size: 5 }, value: (_u, v) => fmt(v) },
    ];
    const data: (number | null)[][] = [times, values];
    if (smoothed) {
      uSeries.push({ label: "1.5 s smoothed", stroke: "#3f7f8c", width: 2, points: { show: !many, size: 4 }, value: (_u, v) => fmt(v) });
      data.push(smoothed);
    }
    if (tableLimit !== null) {
      uSeries.push({ label: "table limit", stroke: "#b4582a", width: 1.8, points: { show: false }, value: (_u, v) => fmt(v) });
      data.push(times.map(() => tableLimit));
      multipliers.forEach((m) => {
        uSeries.push({ label: `limit ${formatMultiplier(m)}`, stroke: "#b3261e", width: 1.5, dash: [6, 4], points: { show: false }, value: (_u, v) => fmt(v) });
        data.push(times.map(() => tableLimit * m));
      });
    }
    const peak = Math.max(...data.slice(1).flatMap((s) => s.map((v) => v ?? 0)), 1e-12);
    const options: Omit<uPlot.Options, "width" | "height"> = {
      scales: { x: { time: false, range: (_u, min, max) => (min === max ? [min - windowDurationS, max + windowDurationS] : [min, max]) }, y: { range: () => [0, peak * 1.12] } },
      series: uSeries,
      axes: [
        { ...axisStyle, label: "time from start (s)" },
        { ...axisStyle, label: row.unit, size: 56 },
      ],
      cursor: { drag: { x: false, y: false } },
    };
    return { options, aligned: data as uPlot.AlignedData };
  }, [series, row, windowDurationS, context, irefA, showSmoothed]);
  if ("error" in built) return <p className="text-sm text-ink-muted">{built.error}</p>;
  return <UPlotChart options={built.options} data={built.aligned} label={`Order ${row.order} over the record with its limits`} testId="chart-order-trend" height={200} />;
}
