// The part of a loaded sheet (lib/captures/load-sheet.ts) that the PDF and CSV builders read.
// Structural, so `loadSheet(...)` results fit and unit tests can build one by hand.
import type { ComplianceResult } from "@/lib/compliance/result";
import type { HeadlineSource } from "./headline-numbers";
import type { RevisionVerification } from "./limits-line";

export interface SheetReport {
  capture: {
    id: string;
    title: string;
    originalFilename: string;
    capturedAt: Date | null;
    createdAt: Date;
    reviewState: string;
  };
  site: { name: string; nominalVoltageV: number; frequencyHz: number };
  uploaderName: string | null;
  evaluation: {
    id: string;
    verdict: string;
    limitSetKey: string;
    limitSetName: string;
    revisionNumber: number;
    createdAt: Date;
    createdByName: string | null;
    result: ComplianceResult;
  } | null;
  reviews: Array<{ action: string; comment: string; createdAt: Date; actorName: string | null }>;
  /** The stored analysis, for the headline numbers (lib/reports/headline-numbers.ts). */
  analysis?: { result: HeadlineSource } | null;
  /** The newest verification of the evaluation's limit-set revision; null or absent: not yet verified. */
  limitsVerification?: RevisionVerification | null;
}

/** The channel blocks of a result: every evaluated channel, or the top level when none are listed. */
export function channelBlocks(result: ComplianceResult) {
  if (result.channels.length > 0) return result.channels;
  return [
    {
      channel: result.channel ?? "—",
      phase: null,
      band: result.band,
      rows: result.rows,
      aggregates: result.aggregates,
      conditions: result.conditions,
      verdict: result.verdict,
      derived: { notes: [] as string[] },
    },
  ];
}
