"use client";

import useSWR from "swr";
import type { CsvPreview } from "@/lib/analysis/inspect-csv";
import { fetcher } from "./fetcher";

export interface PreviewDto {
  preview: CsvPreview | null;
  problem: string | null;
  firstLines: string[];
}

export function usePreview(captureId: string) {
  return useSWR<PreviewDto>(`/api/captures/${captureId}/preview`, fetcher, { revalidateOnFocus: false });
}
