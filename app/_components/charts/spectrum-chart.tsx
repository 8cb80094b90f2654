"use client";

import { useMemo } from "react";
import uPlot from "uplot";
import type { ComplianceRow } from "@/lib/compliance/result";
import { spectrumBars, type SpectrumScale } from "@/lib/reports/spectrum-bars";
import type { ChartDataDto } from "@/lib/swr/use-capture-charts";
import { axisStyle, UPlotChart } from "./uplot-chart";

export type SpectrumMode = "amperes" | "percent";

/** Draws each limit as a short horizontal mark across its order's slot. */
const limitMarks: uPlot.Series.PathBuilder = (u, seriesIdx, idx0, idx1) => {
  const xs = u.data[0];
  const ys = u.data[seriesIdx] as (number | null)[];
  const path = new Path2D();
  const slot = xs.length > 1 ? Math.abs(u.valToPos(xs[1]!, "x", true) - u.valToPos(xs[0]!, "x", true)) : 20;
  for (let i = idx0; i <= idx1; i += 1) {
    const y = ys[i];
    if (y == null) continue;
    const cx = u.valToPos(xs[i]!, "x", true);
    const cy = u.valToPos(y, u.series[seriesIdx]!.scale ?? "y", true);
    path.moveTo(cx - slot * 0.45, cy);
    path.lineTo(cx + slot * 0.45, cy);
  }
  return { stroke: path, fill: null, clip: null, flags: 0 };
};

/**
 * Spectrum of one channel as bars from order 2 up (amperes/volts or % of the fundamental) with the
 * evaluation's limit for each order drawn over it. Orders over their limit are drawn in the fail colour.
 * Where a time rule decided an order the bar is the value that rule compared and the mark its limit
 * (`spectrumBars`; `scale` gives IL, Iref and the nominal voltage for rows in %IL, %Iref, %Vnom).
 */
export function SpectrumChart({ channel, rows, mode, scale = {} }: { channel: ChartDataDto["channels"][number]; rows: ComplianceRow[]; mode: SpectrumMode; scale?: Omit<SpectrumScale, "fundamentalRms"> }) {
  const built = useMemo(() => {
    const fundamental = channel.harmonics.find((h) => h.order === 1)?.rms ?? null;
    const harmonics = channel.harmonics.filter((h) => h.order >= 2 && h.rms !== null);
    if (harmonics.length === 0 || !fundamental) return null;
    const toMode = (v: number | null) => (v === null ? null : mode === "percent" ? (v / fundamental) * 100 : v);
    const orders = harmonics.map((h) => h.order);
    const within: (number | null)[] = [];
    const over: (number | null)[] = [];
    const limits: (number | null)[] = [];
    for (const bar of spectrumBars(harmonics, rows, { ...scale, fundamentalRms: fundamental })) {
      const value = toMode(bar.value);
      within.push(bar.failing ? null : value);
      over.push(bar.failing ? value : null);
      limits.push(toMode(bar.limit));
    }
    const unit = mode === "percent" ? "% of fundamental" : channel.unit;
    const fmt = (v: number | null) => (v == null ? "—" : `${v.toPrecision(3)} ${mode === "percent" ? "%" : channel.unit}`);
    const bars = uPlot.paths.bars!({ size: [0.6, 40], align: 0 });
    const options: Omit<uPlot.Options, "width" | "height"> = {
      scales: { x: { time: false, range: (_u, min, max) => [min - 0.7, max + 0.7] }, y: { range: (_u, _min, max) => [0, max > 0 ? max * 1.08 : 1] } },
      series: [
        { label: "order", value: (_u, v) => (v == null ? "—" : `h${v}`) },
        { label: "measured", fill: "#3c4b5e", stroke: "#3c4b5e", paths: bars, points: { show: false }, value: (_u, v) => fmt(v) },
        { label: "over limit", fill: "#b3261e", stroke: "#b3261e", paths: bars, points: { show: false }, value: (_u, v) => fmt(v) },
        { label: "limit", stroke: "#b4582a", width: 2.5, paths: limitMarks, points: { show: false }, value: (_u, v) => fmt(v) },
      ],
      axes: [
        { ...axisStyle, label: "harmonic order", incrs: [1, 2, 5, 10, 20, 25, 50] },
        { ...axisStyle, label: unit, size: 56 },
      ],
      cursor: { drag: { x: false, y: false }, points: { show: false } },
    };
    return { options, aligned: [orders, within, over, limits] as uPlot.AlignedData };
  }, [channel, rows, mode, scale.ilA, scale.irefA, scale.nominalVoltageV]);
  if (!built) return <p className="text-sm text-ink-muted">No harmonic values to plot for this channel.</p>;
  return <UPlotChart options={built.options} data={built.aligned} label={`Spectrum of ${channel.name} with its limits`} testId="chart-spectrum" height={240} />;
}
