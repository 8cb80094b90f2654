"use client";

import useSWR from "swr";
import type { Diagnosis } from "@/lib/frontends/diagnose-channels";
import type { MitigationStudyInputs } from "@/lib/mitigation/study-inputs";
import type { WhatIfResult } from "@/lib/mitigation/types";
import { fetcher } from "./fetcher";

export interface SavedStudyDto {
  id: string;
  title: string;
  modelVersion: string;
  inputs: MitigationStudyInputs;
  result: WhatIfResult;
  predictedVerdict: string;
  includeInReport: boolean;
  createdAt: string;
  authorName: string | null;
}

export const captureStudiesKey = (captureBase: string) => `${captureBase}/studies`;

/** The capture's front-end diagnosis (null key: not fetched). */
export function useCaptureDiagnosis(captureBase: string | null) {
  return useSWR<{ diagnosis: Diagnosis }>(captureBase ? `${captureBase}/diagnosis` : null, fetcher, { revalidateOnFocus: false });
}

/** The capture's saved mitigation studies and whether this user may save one. */
export function useMitigationStudies(captureBase: string | null) {
  return useSWR<{ studies: SavedStudyDto[]; canSave: boolean }>(captureBase ? captureStudiesKey(captureBase) : null, fetcher);
}
