"use client";

import { useEffect, useRef } from "react";
import uPlot from "uplot";
import "uplot/dist/uPlot.min.css";

/**
 * One uPlot chart that follows its container's width (phones included). The chart is created
 * and destroyed in an effect; pass memoised `options` and `data` so it is rebuilt only when they change.
 */
export function UPlotChart({
  options,
  data,
  height = 220,
  label,
  testId,
}: {
  options: Omit<uPlot.Options, "width" | "height">;
  data: uPlot.AlignedData;
  height?: number;
  label: string;
  testId?: string;
}) {
  const ref = useRef<HTMLDivElement>(null);
  useEffect(() => {
    const el = ref.current;
    if (!el) return;
    const widthOf = () => Math.max(Math.floor(el.clientWidth), 160);
    const chart = new uPlot({ ...options, width: widthOf(), height }, data, el);
    let last = widthOf();
    const observer = new ResizeObserver(() => {
      const w = widthOf();
      if (w !== last) {
        last = w;
        chart.setSize({ width: w, height });
      }
    });
    observer.observe(el);
    return () => {
      observer.disconnect();
      chart.destroy();
    };
  }, [options, data, height]);
  return <div ref={ref} role="img" aria-label={label} data-testid={testId} className="ordwise-chart w-full min-w-0 overflow-hidden text-xs" />;
}

/** Series colours from the app palette: copper, ink, slate-teal for phases a, b, c. */
export const seriesColours = ["#b4582a", "#1d2a3a", "#3f7f8c", "#8a6100", "#6b788a", "#1f7a4d"];

export const axisStyle = {
  stroke: "#6b788a",
  grid: { stroke: "#ece6db", width: 1 },
  ticks: { stroke: "#ddd6ca", width: 1 },
  font: "11px system-ui, sans-serif",
  labelFont: "11px system-ui, sans-serif",
} satisfies Partial<uPlot.Axis>;

const isoOf = (s: number) => new Date(s * 1000).toISOString();

/**
 * A time axis in the product's date format, in UTC whatever the browser's zone and locale: days as
 * YYYY-MM-DD, shorter steps as HH:MM with the date under the first tick of each day. Use with
 * `utcTimeOptions` (which aligns the ticks to UTC midnight and words the legend's time).
 */
export const utcTimeAxis = {
  space: 84,
  values: (_u: uPlot, splits: number[], _axisIdx: number, _space: number, incr: number) =>
    splits.map((s, k) => {
      const at = isoOf(s);
      if (incr >= 86_400) return at.slice(0, 10);
      const newDay = k === 0 || isoOf(splits[k - 1]!).slice(0, 10) !== at.slice(0, 10);
      return newDay ? `${at.slice(11, 16)}\n${at.slice(0, 10)}` : at.slice(11, 16);
    }),
} satisfies Partial<uPlot.Axis>;

/** Chart options for an x scale of Unix seconds read in UTC: day ticks at UTC midnight. */
export const utcTimeOptions = {
  tzDate: (ts: number) => uPlot.tzDate(new Date(ts * 1000), "Etc/UTC"),
} satisfies Partial<uPlot.Options>;

/** The legend's time of a point: "YYYY-MM-DD HH:MM UTC". */
export const utcTimeLegend = (_u: uPlot, v: number | null) => (v == null ? "—" : `${isoOf(v).slice(0, 16).replace("T", " ")} UTC`);
