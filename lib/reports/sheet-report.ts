// The part of a loaded sheet (lib/captures/load-sheet.ts) that the PDF and CSV builders read.
// Structural, so `loadSheet(...)` results fit and unit tests can build one by hand.
import type { AnalysisResult } from "@/lib/analysis/types";
import type { ChannelCompliance, ComplianceResult } from "@/lib/compliance/result";
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
    approvedEvaluationId?: string | null;
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
  /** The approval of the shown evaluation, when it is the approved one. */
  approval?: { actorName: string | null; createdAt: Date; comment: string } | null;
  /** The analysis behind the evaluation (headline numbers, lib/reports/headline-numbers.ts), with the set-up and file hash it ran with. */
  analysis?: {
    result: HeadlineSource & Pick<AnalysisResult, "sampleIntervalS">;
    setup?: Record<string, unknown> | null;
    fileSha256?: string | null;
  } | null;
  reviews: Array<{ action: string; comment: string; createdAt: Date; actorName: string | null }>;
  /** The newest verification of the evaluation's limit-set revision; null or absent: not yet verified. */
  limitsVerification?: RevisionVerification | null;
}

/** One channel of a sheet: as judged, or the top level of a result that lists no channels. */
export type ChannelBlock = ReturnType<typeof channelBlocks>[number];

/** The channel blocks of a result: every evaluated channel, or the top level when none are listed. */
export function channelBlocks(result: ComplianceResult): ChannelCompliance[] {
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
      derived: { notes: [] },
      ...(result.timeRules ? { timeRules: result.timeRules } : {}),
      ...(result.power ? { power: result.power } : {}),
    },
  ];
}
