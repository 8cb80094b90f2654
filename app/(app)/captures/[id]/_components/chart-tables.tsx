"use client";

import { VerdictBadge } from "@/app/_components/verdict-badge";
import type { ComplianceRow } from "@/lib/compliance/result";
import type { IntervalTrend, IntervalTrendSeries } from "@/lib/intervals/evaluate-interval-log";
import { formatNumber, formatPercent, formatWhen } from "@/lib/reports/format";
import { spectrumBars, type SpectrumScale } from "@/lib/reports/spectrum-bars";
import { decidedByLabel, formatPercentOfLimit } from "@/lib/reports/time-rules";
import type { ChartDataDto } from "@/lib/swr/use-capture-charts";

// Every chart's values without a mouse: a native disclosure ("Show as table") that a keyboard opens,
// holding the numbers the chart draws.

function Toggle({ testId, children }: { testId: string; children: React.ReactNode }) {
  return (
    <details className="mt-2 text-sm" data-testid={testId}>
      <summary className="cursor-pointer text-copper-dark underline-offset-2 hover:underline">Show as table</summary>
      <div className="mt-2 max-h-80 overflow-auto rounded border border-line">{children}</div>
    </details>
  );
}

/** The orders over their limit, as text under the spectrum (always visible). */
export function FailingOrdersText({ rows }: { rows: ComplianceRow[] }) {
  const failing = rows.filter((r) => r.verdict === "fail");
  return (
    <p className="mt-1 text-sm" data-testid="spectrum-failing">
      {failing.length === 0
        ? "No order is over its limit."
        : `Over the limit: ${failing.map((r) => `h${r.order} (${formatNumber(r.measured)} ${r.unit} against ${formatNumber(r.limit)} ${r.unit}, ${formatPercentOfLimit(r, { standalone: true })})`).join("; ")}.`}
    </p>
  );
}

/**
 * The spectrum's bars and limit marks as rows: order, the value the verdict compared and its limit
 * (both in the channel's unit, as the bars draw them), % of the table limit, verdict.
 */
export function SpectrumTable({ channel, rows, scale = {} }: { channel: ChartDataDto["channels"][number]; rows: ComplianceRow[]; scale?: Omit<SpectrumScale, "fundamentalRms"> }) {
  const byOrder = new Map(rows.map((r) => [r.order, r]));
  const fundamentalRms = channel.harmonics.find((h) => h.order === 1)?.rms ?? 0;
  const bars = new Map(spectrumBars(channel.harmonics, rows, { ...scale, fundamentalRms }).map((b) => [b.order, b]));
  return (
    <Toggle testId="spectrum-table">
      <table className="table-base tabular-nums [&_th]:!normal-case [&_th]:!tracking-normal">
        <thead>
          <tr><th scope="col">Order</th><th scope="col">Measured ({channel.unit})</th><th scope="col">% of fundamental</th><th scope="col">Limit ({channel.unit})</th><th scope="col">% of limit</th><th scope="col">Verdict</th></tr>
        </thead>
        <tbody>
          {channel.harmonics.map((h) => {
            const row = byOrder.get(h.order);
            const bar = bars.get(h.order);
            return (
              <tr key={h.order} data-testid={`spectrum-table-row-${h.order}`}>
                <th scope="row">h{h.order}</th>
                <td>
                  {formatNumber(bar?.value ?? h.rms)}
                  {bar?.byTimeRule && row && <span className="block text-xs text-ink-muted">{decidedByLabel(row)}</span>}
                </td>
                <td>{formatPercent(h.percentOfFundamental)}</td>
                <td>{formatNumber(bar?.limit ?? null)}</td>
                <td>{row ? formatPercentOfLimit(row) : "—"}</td>
                <td>{row ? <VerdictBadge verdict={row.verdict} /> : "—"}</td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </Toggle>
  );
}

/** The waveform excerpt's samples: time and one column per channel. */
export function WaveformTable({ waveform }: { waveform: NonNullable<ChartDataDto["waveform"]> }) {
  return (
    <Toggle testId="waveform-table">
      <table className="table-base tabular-nums [&_th]:!normal-case [&_th]:!tracking-normal">
        <thead>
          <tr>
            <th scope="col">Time (ms)</th>
            {waveform.channels.map((c) => <th key={c.name} scope="col">{c.name}</th>)}
          </tr>
        </thead>
        <tbody>
          {waveform.timeS.map((t, i) => (
            <tr key={i}>
              <th scope="row">{(t * 1000).toFixed(2)}</th>
              {waveform.channels.map((c) => <td key={c.name}>{formatNumber(c.values[i] ?? null)}</td>)}
            </tr>
          ))}
        </tbody>
      </table>
    </Toggle>
  );
}

/** THD (and r.m.s.) per analysis window. */
export function TrendTable({ channel, windowDurationS }: { channel: ChartDataDto["channels"][number]; windowDurationS: number }) {
  const s = channel.series;
  if (!s) return null;
  return (
    <Toggle testId="trend-table">
      <table className="table-base tabular-nums [&_th]:!normal-case [&_th]:!tracking-normal">
        <thead>
          <tr><th scope="col">Window start (s)</th><th scope="col">RMS ({channel.unit})</th><th scope="col">Fundamental ({channel.unit})</th><th scope="col">THD (%)</th></tr>
        </thead>
        <tbody>
          {s.thdPercent.map((thd, i) => (
            <tr key={i}>
              <th scope="row">{(i * windowDurationS).toFixed(2)}</th>
              <td>{formatNumber(s.rms[i] ?? null)}</td>
              <td>{formatNumber(s.fundamentalRms[i] ?? null)}</td>
              <td>{formatNumber(thd)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </Toggle>
  );
}

/** One order over the record: each point's window r.m.s. and 1.5 s smoothed value. */
export function OrderTrendTable({ series, order, unit, windowDurationS }: { series: NonNullable<ChartDataDto["channels"][number]["harmonicSeries"]>; order: number; unit: string; windowDurationS: number }) {
  const o = series.orders.find((x) => x.order === order);
  if (!o) return null;
  const step = windowDurationS * series.windowsPerPoint;
  return (
    <Toggle testId="order-trend-table">
      <table className="table-base tabular-nums [&_th]:!normal-case [&_th]:!tracking-normal">
        <thead>
          <tr><th scope="col">From (s)</th><th scope="col">h{order} r.m.s. ({unit}){series.windowsPerPoint > 1 ? ", largest of the group" : ""}</th><th scope="col">1.5 s smoothed ({unit})</th></tr>
        </thead>
        <tbody>
          {o.rms.map((v, i) => (
            <tr key={i}>
              <th scope="row">{(i * step).toFixed(2)}</th>
              <td>{formatNumber(v)}</td>
              <td>{formatNumber(o.smoothed[i] ?? null)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </Toggle>
  );
}

/**
 * The interval log's chosen value over the logged period as rows: time (UTC), the value, the table
 * limit and each time rule's limit (table limit × multiplier), as the trend chart draws them.
 */
export function IntervalTrendTable({ trend, series }: { trend: IntervalTrend; series: IntervalTrendSeries }) {
  const ruleLimits = series.ruleLimits.filter((r) => r.limit !== series.limit);
  const grouped = (trend.rowsPerPoint ?? 1) > 1;
  return (
    <Toggle testId="interval-trend-table">
      <table className="table-base tabular-nums [&_th]:!normal-case [&_th]:!tracking-normal">
        <thead>
          <tr>
            <th scope="col">Time</th>
            <th scope="col">
              {series.name} ({series.unit}){grouped ? `, largest of ${trend.rowsPerPoint} logged values` : ""}
            </th>
            {series.limit !== null && <th scope="col">Table limit ({series.unit})</th>}
            {ruleLimits.map((r) => <th key={r.rule} scope="col">{r.label} ({series.unit})</th>)}
          </tr>
        </thead>
        <tbody>
          {series.values.map((v, i) => (
            <tr key={i}>
              <th scope="row">{formatWhen(new Date(trend.timestampsMs[i] ?? 0))}</th>
              <td>{formatNumber(v)}</td>
              {series.limit !== null && <td>{formatNumber(series.limit)}</td>}
              {ruleLimits.map((r) => <td key={r.rule}>{formatNumber(r.limit)}</td>)}
            </tr>
          ))}
        </tbody>
      </table>
    </Toggle>
  );
}
