"use client";

import useSWR from "swr";
import type { Quantity } from "@/lib/analysis/types";
import type { IntervalTrend } from "@/lib/intervals/evaluate-interval-log";
import type { DecimatedSeries } from "@/lib/reports/decimate-series";
import { fetcher } from "./fetcher";

/** GET /api/captures/:id/charts (or the share link's charts route) as the client receives it. */
export interface ChartDataDto {
  fundamentalHz: number;
  windowDurationS: number;
  waveform: { timeS: number[]; channels: { name: string; unit?: string; values: number[] }[] } | null;
  channels: {
    name: string;
    quantity: Quantity;
    unit: string;
    harmonics: { order: number; rms: number | null; percentOfFundamental: number | null }[];
    series: { rms: number[]; thdPercent: number[]; fundamentalRms: number[] } | null;
    /** Per-order window series of the judged orders, at most 600 points each (absent from older servers). */
    harmonicSeries?: DecimatedSeries | null;
  }[];
  /** Interval logs: per-channel series over the logged period with their limits. */
  intervalTrends?: IntervalTrend[] | null;
}

/** Chart data from `url`: `/api/captures/:id/charts` when signed in, `/api/shared/:token/charts` on a share link. */
export function useCaptureCharts(url: string | null) {
  return useSWR<ChartDataDto>(url, fetcher, { revalidateOnFocus: false });
}
