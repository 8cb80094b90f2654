"use client";

import useSWR from "swr";
import type { IntervalLogPreview } from "@/lib/intervals/inspect-interval-log";
import { fetcher } from "./fetcher";

export interface IntervalPreviewDto {
  preview: IntervalLogPreview | null;
  problem: string | null;
  firstLines: string[];
}

export function useIntervalPreview(captureId: string) {
  return useSWR<IntervalPreviewDto>(`/api/captures/${captureId}/interval-preview`, fetcher, { revalidateOnFocus: false });
}
