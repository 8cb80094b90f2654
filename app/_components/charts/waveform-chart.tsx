"use client";

import { useMemo } from "react";
import type uPlot from "uplot";
import type { ChartDataDto } from "@/lib/swr/use-capture-charts";
import { axisStyle, seriesColours, UPlotChart } from "./uplot-chart";

/** A few cycles of every channel: currents on the left axis (A), voltages on the right (V). */
export function WaveformChart({ data }: { data: ChartDataDto }) {
  const waveform = data.waveform;
  const built = useMemo(() => {
    if (!waveform || waveform.timeS.length < 2) return null;
    const quantityOf = (name: string, unit?: string) =>
      data.channels.find((c) => c.name === name)?.quantity ?? (unit === "V" ? "voltage" : "current");
    const hasV = waveform.channels.some((c) => quantityOf(c.name, c.unit) === "voltage");
    const hasA = waveform.channels.some((c) => quantityOf(c.name, c.unit) === "current");
    const series: uPlot.Series[] = [
      { label: "t (ms)", value: (_u, v) => (v == null ? "—" : v.toFixed(2)) },
      ...waveform.channels.map((c, i): uPlot.Series => {
        const voltage = quantityOf(c.name, c.unit) === "voltage";
        return {
          label: c.name,
          scale: voltage ? "V" : "A",
          stroke: seriesColours[i % seriesColours.length],
          width: 1.5,
          dash: voltage ? [5, 3] : undefined,
          value: (_u, v) => (v == null ? "—" : `${v.toPrecision(4)} ${voltage ? "V" : "A"}`),
        };
      }),
    ];
    const axes: uPlot.Axis[] = [{ ...axisStyle, label: "time (ms)" }];
    if (hasA) axes.push({ ...axisStyle, scale: "A", label: "current (A)" });
    if (hasV) axes.push({ ...axisStyle, scale: "V", label: "voltage (V)", side: hasA ? 1 : 3, grid: { show: !hasA } });
    const options: Omit<uPlot.Options, "width" | "height"> = {
      scales: { x: { time: false } },
      series,
      axes,
      cursor: { drag: { x: false, y: false } },
      legend: { live: true },
    };
    const aligned: uPlot.AlignedData = [waveform.timeS.map((t) => t * 1000), ...waveform.channels.map((c) => c.values)];
    return { options, aligned };
  }, [waveform, data.channels]);
  if (!built) return <p className="text-sm text-ink-muted">No waveform was kept for this capture.</p>;
  return <UPlotChart options={built.options} data={built.aligned} label="Waveform of the first cycles of each channel" testId="chart-waveform" />;
}
