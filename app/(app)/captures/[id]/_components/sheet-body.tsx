"use client";

import Link from "next/link";
import { usePathname, useSearchParams } from "next/navigation";
import { useMemo, useState } from "react";
import { IntervalTrendChart } from "@/app/_components/charts/interval-trend-chart";
import { OrderTrendChart } from "@/app/_components/charts/order-trend-chart";
import { SpectrumChart, type SpectrumMode } from "@/app/_components/charts/spectrum-chart";
import { TrendChart } from "@/app/_components/charts/trend-chart";
import { WaveformChart } from "@/app/_components/charts/waveform-chart";
import { VerdictBadge } from "@/app/_components/verdict-badge";
import type { EvaluationContext } from "@/lib/compliance/model";
import type { ChannelCompliance } from "@/lib/compliance/result";
import { formatOrders, groupReasons, verdictLabel } from "@/lib/reports/format";
import { conditionReasonText, powerChoiceRows } from "@/lib/reports/result-wording";
import type { SheetBodyPayload } from "@/lib/reports/sheet-body-data";
import { unpackSheetBody } from "@/lib/reports/unpack-sheet-body";
import { decidedByLabel, timeRuleLines } from "@/lib/reports/time-rules";
import { useCaptureCharts } from "@/lib/swr/use-capture-charts";
import { AggregateCards } from "./aggregate-cards";
import { MitigationPanels } from "./mitigation-panels";
import { FailingOrdersText, IntervalTrendTable, OrderTrendTable, SpectrumTable, TrendTable, WaveformTable } from "./chart-tables";
import { OrderCards } from "./order-cards";
import { OrderTable } from "./order-table";
import { TimeRulesPanel } from "./time-rules-panel";

/**
 * The interactive part of a sheet: channel/phase selector, aggregates, charts and the per-order
 * table of the chosen channel. Used by the signed-in sheet and the read-only share page. It gets the
 * shown channel only, each rule's words once (lib/reports/sheet-body-data.ts); choosing another one is a link (`?channel=`),
 * which the server answers with that channel's data.
 */
export function SheetBody({ payload, chartsUrl }: { payload: SheetBodyPayload; chartsUrl: string }) {
  const data = useMemo(() => unpackSheetBody(payload), [payload]);
  const { channels, channel } = data;
  const pathname = usePathname();
  const searchParams = useSearchParams();
  const channelHref = (name: string) => {
    const query = new URLSearchParams(searchParams.toString());
    query.set("channel", name);
    return `${pathname}?${query.toString()}`;
  };
  const reasons = groupReasons(channel.rows);
  const rules = useMemo(() => timeRuleLines(channel.timeRules, channel.rows, channel.aggregates), [channel]);
  return (
    <div className="space-y-4" data-testid="sheet-body">
      {channels.length > 1 && (
        <div className="flex flex-wrap items-center gap-2" role="group" aria-label="Channel" data-testid="channel-select">
          <span className="text-sm text-ink-soft">Channel</span>
          {channels.map((c) => (
            <Link
              key={c.channel}
              href={channelHref(c.channel)}
              scroll={false}
              replace
              aria-current={c.channel === channel.channel ? "true" : undefined}
              data-testid={`channel-${c.channel}`}
              className={`inline-flex items-center gap-2 rounded-md border px-2.5 py-1.5 text-sm ${c.channel === channel.channel ? "border-copper bg-copper-light font-semibold" : "border-line bg-paper-raised hover:bg-paper-sunk"}`}
            >
              {c.channel}
              {c.phase ? <span className="text-ink-muted">phase {c.phase.toUpperCase()}</span> : null}
              <VerdictBadge verdict={c.verdict} testId={`channel-verdict-${c.channel}`} />
            </Link>
          ))}
        </div>
      )}
      {channels.length > 1 && (
        <p className="text-sm text-ink-soft" data-testid="channel-band">
          Band for {channel.channel}: <strong>{channel.band.label ?? "none chosen"}</strong> — {channel.band.reason}
        </p>
      )}
      {channel.power && (
        <dl className="grid gap-x-6 gap-y-1 text-sm text-ink-soft sm:grid-cols-3" data-testid="power-choice" data-rule={channel.power.rule}>
          {powerChoiceRows(channel.power).map(([k, v]) => (
            <div key={k} className={k === "Power used for the limits" ? "sm:col-span-3" : undefined}>
              <dt className="inline text-ink-muted">{k}: </dt>
              <dd className="inline">{v}</dd>
            </div>
          ))}
        </dl>
      )}
      {channel.derived.notes.length > 0 && (
        <ul className="list-disc pl-5 text-sm text-ink-soft">
          {channel.derived.notes.map((n) => <li key={n}>{n}</li>)}
        </ul>
      )}

      <AggregateCards aggregates={channel.aggregates} />

      <SheetCharts chartsUrl={chartsUrl} channel={channel} context={data.context} smoothing={rules.some((r) => r.interval === "1.5 s smoothed")} />

      <TimeRulesPanel key={`rules-${channel.channel}`} rules={rules} basis={data.timeBasis} channelName={channel.channel} />

      {/* Wide screens: the sortable table. Phones: one card per order, no sideways scrolling. */}
      <section className="panel hidden p-0 sm:p-0 md:block" aria-labelledby="orders-heading">
        <OrderTable key={channel.channel} rows={channel.rows} channelName={channel.channel} />
      </section>
      <div className="md:hidden">
        <OrderCards key={`cards-${channel.channel}`} rows={channel.rows} channelName={channel.channel} />
      </div>

      <MitigationPanels key={`fix-${channel.channel}`} chartsUrl={chartsUrl} channel={channel} context={data.context} />
      {reasons.length > 0 && (
        <section className="panel text-sm" data-testid="row-reasons">
          <h2 className="mb-2">Why some orders are not a plain pass or fail</h2>
          <ul className="space-y-1.5 text-ink-soft">
            {reasons.map(({ orders, reason }) => (
              <li key={reason}>
                <span className="font-medium text-ink">Order {formatOrders(orders)}:</span> {reason}
              </li>
            ))}
          </ul>
        </section>
      )}
      {channel.conditions.length > 0 && (
        <section className="panel text-sm" data-testid="conditions">
          <h2 className="mb-2">Conditions of the band</h2>
          <ul className="space-y-1.5">
            {channel.conditions.map((c) => (
              <li key={c.id}>
                <VerdictBadge verdict={c.verdict} /> <span className="font-medium">{c.text}</span>
                <span className="block text-ink-soft">{conditionReasonText(c)}</span>
              </li>
            ))}
          </ul>
        </section>
      )}
    </div>
  );
}

function SheetCharts({ chartsUrl, channel, context, smoothing }: { chartsUrl: string; channel: ChannelCompliance; context: EvaluationContext; smoothing: boolean }) {
  const ilA = context.ilA;
  // The bases the evaluator divided by, so %IL / %Iref / %Vnom rows decided by a time rule draw at the channel's scale.
  const spectrumScale = useMemo(
    () => ({ ilA: context.ilA, irefA: channel.derived.irefA ?? context.irefA, nominalVoltageV: context.nominalVoltageV }),
    [context.ilA, context.irefA, context.nominalVoltageV, channel.derived.irefA],
  );
  const { data, error, isLoading } = useCaptureCharts(chartsUrl);
  const [mode, setMode] = useState<SpectrumMode>("amperes");
  const chartChannel = data?.channels.find((c) => c.name === channel.channel) ?? data?.channels[0];
  const orderSeries = chartChannel?.name === channel.channel ? chartChannel.harmonicSeries ?? null : null;
  const trendRows = useMemo(() => {
    const available = new Set(orderSeries?.orders.map((o) => o.order) ?? []);
    return channel.rows.filter((r) => r.limit !== null && available.has(r.order));
  }, [channel.rows, orderSeries]);
  // Start with the order closest to (or furthest over) its limit.
  const worst = trendRows.reduce<(typeof trendRows)[number] | undefined>((best, r) => ((r.percentOfLimit ?? -1) > (best?.percentOfLimit ?? -1) ? r : best), undefined);
  const [chosenOrder, setChosenOrder] = useState<number | null>(null);
  const trendRow = trendRows.find((r) => r.order === chosenOrder) ?? worst;
  if (data?.intervalTrends) {
    const trend = data.intervalTrends.find((t) => t.channel === channel.channel) ?? data.intervalTrends[0];
    return (
      <section className="panel min-w-0" aria-label="Charts" data-testid="sheet-charts">
        <h2 className="mb-2">{trend?.channel ?? channel.channel} over the logged period</h2>
        {trend ? <IntervalTrendChart trend={trend} table={(series) => <IntervalTrendTable trend={trend} series={series} />} /> : <p className="text-sm text-ink-muted">No trend data.</p>}
      </section>
    );
  }
  return (
    <section className="grid gap-4 lg:grid-cols-2" aria-label="Charts" data-testid="sheet-charts">
      <div className="panel min-w-0 lg:col-span-2">
        <div className="mb-2 flex flex-wrap items-center justify-between gap-2">
          <h2>Spectrum of {chartChannel?.name ?? channel.channel} with limits</h2>
          <div className="flex gap-1 text-xs" role="group" aria-label="Spectrum units">
            {(["amperes", "percent"] as const).map((m) => (
              <button
                key={m}
                type="button"
                aria-pressed={mode === m}
                onClick={() => setMode(m)}
                data-testid={`spectrum-mode-${m}`}
                className={`rounded border px-2 py-1 ${mode === m ? "border-copper bg-copper-light font-semibold" : "border-line"}`}
              >
                {m === "amperes" ? (chartChannel?.unit === "V" ? "volts" : "amperes") : "% of fundamental"}
              </button>
            ))}
          </div>
        </div>
        {error ? (
          <p className="text-sm text-fail">Charts could not be loaded: {error.message}</p>
        ) : isLoading || !data || !chartChannel ? (
          <div className="h-60 animate-pulse rounded bg-paper-sunk" aria-label="Loading chart" />
        ) : (
          <SpectrumChart channel={chartChannel} rows={channel.rows} mode={mode} scale={spectrumScale} />
        )}
        <p className="mt-1 text-xs text-ink-muted">
          Bars: the value each verdict compared — the r.m.s. mean per order, or the deciding time rule&apos;s value (red where over the limit). Copper marks: the limit it was compared with.
        </p>
        <FailingOrdersText rows={channel.rows} />
        {data && chartChannel && <SpectrumTable channel={chartChannel} rows={channel.rows} scale={spectrumScale} />}
      </div>
      <div className="panel min-w-0">
        <h2 className="mb-2">Waveform</h2>
        {data ? <WaveformChart data={data} /> : <div className="h-52 animate-pulse rounded bg-paper-sunk" />}
        {data?.waveform && <WaveformTable waveform={data.waveform} />}
      </div>
      <div className="panel min-w-0">
        <h2 className="mb-2">{ilA !== undefined ? "THD and TDD" : "THD"} over the windows</h2>
        {data && chartChannel ? (
          <>
            <TrendChart channel={chartChannel} windowDurationS={data.windowDurationS} ilA={ilA} />
            <TrendTable channel={chartChannel} windowDurationS={data.windowDurationS} />
          </>
        ) : (
          <div className="h-44 animate-pulse rounded bg-paper-sunk" />
        )}
      </div>
      <div className="panel min-w-0 lg:col-span-2" data-testid="order-trend">
        <div className="mb-2 flex flex-wrap items-center justify-between gap-2">
          <h2>Order over the record with its limits</h2>
          {trendRows.length > 0 && trendRow && (
            <label className="flex items-center gap-2 text-sm">
              <span className="text-ink-soft">Order</span>
              <select
                className="field-input w-auto py-1"
                value={trendRow.order}
                onChange={(e) => setChosenOrder(Number(e.target.value))}
                data-testid="order-trend-select"
              >
                {trendRows.map((r) => (
                  <option key={r.order} value={r.order}>
                    h{r.order} · {verdictLabel(r.verdict).toLowerCase()}
                  </option>
                ))}
              </select>
            </label>
          )}
        </div>
        {error ? (
          <p className="text-sm text-fail">Charts could not be loaded: {error.message}</p>
        ) : !data ? (
          <div className="h-48 animate-pulse rounded bg-paper-sunk" />
        ) : !orderSeries || !trendRow ? (
          <p className="text-sm text-ink-muted">No per-window order values were kept for this channel, so no order trend can be drawn.</p>
        ) : (
          <>
            <OrderTrendChart
              series={orderSeries}
              row={trendRow}
              windowDurationS={data.windowDurationS}
              context={context}
              irefA={channel.derived.irefA}
              showSmoothed={smoothing}
            />
            <p className="mt-1 text-xs text-ink-muted" data-testid="order-trend-caption">
              h{trendRow.order}: {orderSeries.windowCount} window value{orderSeries.windowCount === 1 ? "" : "s"}
              {orderSeries.windowsPerPoint > 1 ? ` drawn as ${orderSeries.orders[0]?.rms.length ?? 0} points (largest of each ${orderSeries.windowsPerPoint} windows)` : ""}
              {smoothing ? "; the 1.5 s smoothed line is the IEC 61000-4-7 filter over every window" : ""}. Solid copper: table limit; dashed red: limit × a rule's multiplier.
              {trendRow.decidedBy ? ` Verdict ${trendRow.verdict} decided by ${decidedByLabel(trendRow)}.` : ""}
            </p>
            <OrderTrendTable series={orderSeries} order={trendRow.order} unit={trendRow.unit} windowDurationS={data.windowDurationS} />
          </>
        )}
      </div>
    </section>
  );
}
