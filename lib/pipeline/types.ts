// Shapes the pipeline passes between its steps (the worker, the command line and the seed use them).
import type { LimitSetRevisionContent } from "@/lib/compliance/model";

export interface Waveform {
  timeS: number[];
  channels: { name: string; unit: string; values: number[] }[];
}

/** One limit set at one revision, as the database (or the seed files) give it. */
export interface LimitSetRevision {
  key: string;
  name: string;
  revisionId: string;
  revisionNumber: number;
  content: LimitSetRevisionContent;
}
