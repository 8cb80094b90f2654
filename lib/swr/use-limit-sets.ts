"use client";

import useSWR from "swr";
import type { LimitSetSummary, RevisionHistoryEntry, RevisionView } from "@/db/queries/limit-sets";
import { fetcher } from "./fetcher";

/** A query result as the client receives it: dates arrive as ISO strings. */
export type Wire<T> = { [K in keyof T]: T[K] extends Date ? string : T[K] extends Date | null ? string | null : T[K] };

export type LimitSetSummaryDto = Wire<LimitSetSummary>;
export type RevisionDto = Wire<RevisionView>;
export type RevisionHistoryEntryDto = Wire<RevisionHistoryEntry>;
export interface LimitSetDetailDto {
  limitSet: LimitSetSummaryDto;
  revision: RevisionDto;
}

export const limitSetsKey = "/api/limit-sets";
export const limitSetKey = (key: string) => `/api/limit-sets/${encodeURIComponent(key)}`;
export const limitSetRevisionsKey = (key: string) => `${limitSetKey(key)}/revisions`;

export function useLimitSets(fallbackData?: { limitSets: LimitSetSummaryDto[] }) {
  return useSWR<{ limitSets: LimitSetSummaryDto[] }>(limitSetsKey, fetcher, { fallbackData });
}

export function useLimitSet(key: string | null, fallbackData?: LimitSetDetailDto) {
  return useSWR<LimitSetDetailDto>(key ? limitSetKey(key) : null, fetcher, { fallbackData });
}

export function useLimitSetRevisions(key: string | null, fallbackData?: { limitSet: LimitSetSummaryDto; revisions: RevisionHistoryEntryDto[] }) {
  return useSWR<{ limitSet: LimitSetSummaryDto; revisions: RevisionHistoryEntryDto[] }>(key ? limitSetRevisionsKey(key) : null, fetcher, { fallbackData });
}
