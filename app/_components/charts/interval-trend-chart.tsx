"use client";

import { useMemo, useState } from "react";
import type uPlot from "uplot";
import type { IntervalTrend, IntervalTrendSeries } from "@/lib/intervals/evaluate-interval-log";
import { axisStyle, UPlotChart, utcTimeAxis, utcTimeLegend, utcTimeOptions } from "./uplot-chart";

/**
 * An interval log's values over its whole period for one order or aggregate (TDD, THD), with the
 * table limit and each time rule's limit (table limit × multiplier) drawn as lines. `table` renders
 * the chosen series' values as a table (the "Show as table" toggle) under the chart.
 */
export function IntervalTrendChart({ trend, table }: { trend: IntervalTrend; table?: (series: IntervalTrendSeries) => React.ReactNode }) {
  const choices = useMemo(() => [...trend.aggregates, ...trend.orders].filter((s) => s.values.length > 0), [trend]);
  // Start with the series furthest over (or closest to) its table limit.
  const worst = useMemo(
    () =>
      choices.reduce<(typeof choices)[number] | undefined>((best, s) => {
        const ratio = (x: typeof s) => (x.limit ? Math.max(...x.values) / x.limit : -1);
        return !best || ratio(s) > ratio(best) ? s : best;
      }, undefined),
    [choices],
  );
  const [chosen, setChosen] = useState<string | null>(null);
  const series = choices.find((s) => s.name === chosen) ?? worst;

  const built = useMemo(() => {
    if (!series) return null;
    const times = trend.timestampsMs.map((ms) => ms / 1000);
    const lines: uPlot.Series[] = [
      { label: "Time", value: utcTimeLegend },
      { label: series.name, stroke: "#1d2a3a", width: 1.4, value: (_u, v) => (v == null ? "—" : `${v.toFixed(3)} ${series.unit}`) },
    ];
    const data: (number | null)[][] = [times, series.values];
    if (series.limit !== null) {
      lines.push({ label: "table limit", stroke: "#b4582a", width: 1.6 });
      data.push(times.map(() => series.limit));
    }
    for (const r of series.ruleLimits) {
      if (r.limit === series.limit) continue;
      lines.push({ label: r.label, stroke: "#b3261e", width: 1.2, dash: [6, 4] });
      data.push(times.map(() => r.limit));
    }
    const options: Omit<uPlot.Options, "width" | "height"> = {
      ...utcTimeOptions,
      scales: { x: { time: true }, y: { range: (_u, _min, max) => [0, max > 0 ? max * 1.1 : 1] } },
      series: lines,
      axes: [{ ...axisStyle, ...utcTimeAxis, size: 44 }, { ...axisStyle, label: series.unit, size: 52 }],
      cursor: { drag: { x: true, y: false } },
    };
    return { options, aligned: data as uPlot.AlignedData };
  }, [series, trend.timestampsMs]);

  if (!series || !built) return <p className="text-sm text-ink-muted">This log has no values to draw for {trend.channel}.</p>;
  return (
    <div className="space-y-2">
      <label className="flex items-center gap-2 text-sm">
        <span className="text-ink-soft">Value</span>
        <select className="field-input w-auto py-1" value={series.name} onChange={(e) => setChosen(e.target.value)} data-testid="interval-trend-select">
          {choices.map((s) => (
            <option key={s.name} value={s.name}>
              {s.name}
            </option>
          ))}
        </select>
      </label>
      <UPlotChart options={built.options} data={built.aligned} label={`${series.name} of ${trend.channel} over the logged period`} testId="chart-interval-trend" height={240} />
      <p className="text-xs text-ink-muted">
        {trend.timestampsMs.length} logged values. Solid copper: table limit; dashed red: the limit each time rule compares its statistic with (table limit × multiplier).
      </p>
      {table?.(series)}
    </div>
  );
}
