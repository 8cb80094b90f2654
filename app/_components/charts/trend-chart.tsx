"use client";

import { useMemo } from "react";
import type uPlot from "uplot";
import type { ChartDataDto } from "@/lib/swr/use-capture-charts";
import { axisStyle, UPlotChart } from "./uplot-chart";

/**
 * THD of each analysis window over the capture, and TDD when IL is known
 * (TDD = THD × I1 / IL, since both share the same harmonic sum, IEEE 519 clause 3).
 */
export function TrendChart({ channel, windowDurationS, ilA }: { channel: ChartDataDto["channels"][number]; windowDurationS: number; ilA?: number }) {
  const built = useMemo(() => {
    const s = channel.series;
    if (!s || s.thdPercent.length === 0) return null;
    const times = s.thdPercent.map((_, i) => (i + 0.5) * windowDurationS);
    const showTdd = channel.quantity === "current" && ilA !== undefined && s.fundamentalRms.length === s.thdPercent.length;
    const series: uPlot.Series[] = [
      { label: "t (s)", value: (_u, v) => (v == null ? "—" : v.toFixed(2)) },
      { label: "THD", stroke: "#1d2a3a", width: 1.8, points: { show: s.thdPercent.length < 40, size: 5 }, value: (_u, v) => (v == null ? "—" : `${v.toFixed(2)} %`) },
    ];
    const data: (number | null)[][] = [times, s.thdPercent];
    if (showTdd) {
      series.push({ label: "TDD", stroke: "#b4582a", width: 1.8, points: { show: s.thdPercent.length < 40, size: 5 }, value: (_u, v) => (v == null ? "—" : `${v.toFixed(2)} %`) });
      data.push(s.thdPercent.map((thd, i) => (thd * (s.fundamentalRms[i] ?? 0)) / ilA));
    }
    const options: Omit<uPlot.Options, "width" | "height"> = {
      scales: { x: { time: false }, y: { range: (_u, _min, max) => [0, max > 0 ? max * 1.15 : 1] } },
      series,
      axes: [
        { ...axisStyle, label: "time from start (s)" },
        { ...axisStyle, label: "%", size: 48 },
      ],
      cursor: { drag: { x: false, y: false } },
    };
    return { options, aligned: data as uPlot.AlignedData };
  }, [channel, windowDurationS, ilA]);
  if (!built) return <p className="text-sm text-ink-muted">No per-window values for this channel.</p>;
  return <UPlotChart options={built.options} data={built.aligned} label={`THD trend of ${channel.name} over the analysis windows`} testId="chart-trend" height={180} />;
}
