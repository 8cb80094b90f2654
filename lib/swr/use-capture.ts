"use client";

import useSWR from "swr";
import { fetcher } from "./fetcher";

export type CaptureStatus = "uploading" | "uploaded" | "queued" | "running" | "done" | "failed";

/** GET /api/captures/:id as the client receives it (only the fields the status view reads). */
export interface CaptureStatusDto {
  capture: { id: string; status: CaptureStatus; progressPercent: number; failureReason: string | null; updatedAt: string };
}

const active = (status: CaptureStatus | undefined) => status === "queued" || status === "running";

/** A capture's status; polls every `intervalMs` while the analysis is queued or running. */
export function useCapture(captureId: string, { fallback, intervalMs = 1000 }: { fallback?: CaptureStatusDto; intervalMs?: number } = {}) {
  return useSWR<CaptureStatusDto>(`/api/captures/${captureId}`, fetcher, {
    fallbackData: fallback,
    refreshInterval: (data) => (active(data?.capture.status) ? intervalMs : 0),
    revalidateOnFocus: false,
  });
}
