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
  /** The evaluation the study started from (null: saved before studies recorded it). */
  evaluationId: string | null;
  evaluationCreatedAt: string | null;
}

export const captureStudiesKey = (captureBase: string) => `${captureBase}/studies`;

/** The front-end diagnosis of the analysis behind an evaluation of the capture (null key: not fetched). */
export function useCaptureDiagnosis(captureBase: string | null, evaluationId: string | null) {
  const key = captureBase ? `${captureBase}/diagnosis${evaluationId ? `?evaluation=${evaluationId}` : ""}` : null;
  return useSWR<{ diagnosis: Diagnosis }>(key, fetcher, { revalidateOnFocus: false });
}

/** The capture's saved mitigation studies (a viewer's: those of the approved evaluation) and what this user may do. */
export function useMitigationStudies(captureBase: string | null) {
  return useSWR<{ studies: SavedStudyDto[]; approvedEvaluationId: string | null; canSave: boolean; canTryFix: boolean }>(captureBase ? captureStudiesKey(captureBase) : null, fetcher);
}
