"use client";

import useSWR from "swr";
import { fetcher } from "./fetcher";

export interface ShareLinkDto {
  id: string;
  captureId: string;
  label: string;
  createdBy: string | null;
  expiresAt: string;
  revokedAt: string | null;
  createdAt: string;
}

export const captureSharesKey = (captureId: string) => `/api/captures/${captureId}/shares`;

/** The capture's share links (tokens are never returned). */
export function useCaptureShares(captureId: string) {
  return useSWR<{ shares: ShareLinkDto[] }>(captureSharesKey(captureId), fetcher);
}
