"use client";

import useSWR from "swr";
import type { SheetBodyPayload } from "@/lib/reports/sheet-body-data";
import { fetcher } from "./fetcher";

/** GET /api/captures/:id/sheet-body?evaluation=…: the per-order part of the signed-in sheet (null: no channel). */
export function useSheetBody(url: string) {
  return useSWR<{ body: SheetBodyPayload | null }>(url, fetcher, { revalidateOnFocus: false, revalidateIfStale: false, revalidateOnReconnect: false });
}
