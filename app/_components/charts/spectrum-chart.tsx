"use client";

import { useMemo } from "react";
import uPlot from "uplot";
import type { ComplianceRow } from "@/lib/compliance/result";
import type { ChartDataDto } from "@/lib/swr/use-capture-charts";
import { axisStyle, UPlotChart } from "./uplot-chart";

export type SpectrumMode = "amperes" | "percent";

/**
 * The limit of a row in the channel's own unit (A or V). Measured and limit share the row's unit and
 * every basis is linear in amperes, so limit / measured = limitA / rmsA whatever the basis.
 */
export function limitInChannelUnit(row: ComplianceRow, rms: number | null, fundamentalRms: number): number | null {
  if (row.limit === null) return null;
  if (row.unit === "A" || row.unit === "V") return row.limit;
  if (row.unit === "%I1" || row.unit === "%V1") return (row.limit / 100) * fundamentalRms;
  // The ratio holds only while the row's measured value is the capture mean (rms).
  if (!decidedByTimeRule(row) && row.measured !== null && row.measured > 0 && rms !== null && rms > 0) return row.limit * (rms / row.measured);
  return null;
}

function decidedByTimeRule(row: ComplianceRow): boolean {
  return row.decidedBy !== undefined && row.decidedBy !== "snapshot" && row.decidedBy !== "threshold";
}

/**
 * The bar: the value the verdict compared (issue 11: value shown = value judged) — a time rule's
 * statistic where one decided, else the capture mean. Bases other than A, V, %I1 and %V1 keep
 * the capture mean (their scale to amperes is not known here).
 */
export function judgedInChannelUnit(row: ComplianceRow | undefined, rms: number | null, fundamentalRms: number): number | null {
  if (!row || !decidedByTimeRule(row) || row.measured === null) return rms;
  if (row.unit === "A" || row.unit === "V") return row.measured;
  if (row.unit === "%I1" || row.unit === "%V1") return (row.measured / 100) * fundamentalRms;
  return rms;
}

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
 */
export function SpectrumChart({ channel, rows, mode }: { channel: ChartDataDto["channels"][number]; rows: ComplianceRow[]; mode: SpectrumMode }) {
  const built = useMemo(() => {
    const fundamental = channel.harmonics.find((h) => h.order === 1)?.rms ?? null;
    const harmonics = channel.harmonics.filter((h) => h.order >= 2 && h.rms !== null);
    if (harmonics.length === 0 || !fundamental) return null;
    const byOrder = new Map(rows.map((r) => [r.order, r]));
    const toMode = (v: number | null) => (v === null ? null : mode === "percent" ? (v / fundamental) * 100 : v);
    const orders = harmonics.map((h) => h.order);
    const within: (number | null)[] = [];
    const over: (number | null)[] = [];
    const limits: (number | null)[] = [];
    for (const h of harmonics) {
      const row = byOrder.get(h.order);
      const value = toMode(judgedInChannelUnit(row, h.rms, fundamental));
      const failing = row?.verdict === "fail";
      within.push(failing ? null : value);
      over.push(failing ? value : null);
      limits.push(row ? toMode(limitInChannelUnit(row, h.rms, fundamental)) : null);
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
  }, [channel, rows, mode]);
  if (!built) return <p className="text-sm text-ink-muted">No harmonic values to plot for this channel.</p>;
  return <UPlotChart options={built.options} data={built.aligned} label={`Spectrum of ${channel.name} with its limits`} testId="chart-spectrum" height={240} />;
}
