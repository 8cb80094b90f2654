// A loaded sheet built by hand around a real evaluation, for the report builder tests.
import type { AnalysisResult } from "@/lib/analysis/types";
import { judgeWithSeed } from "@/tests/support/judge-with-seed";
import type { EvaluationContext } from "@/lib/compliance/model";
import type { SheetReport } from "@/lib/reports/sheet-report";
import { makeAnalysis, type AnalysisSpec } from "../compliance/make-analysis";

/** `series`: per channel name, per-window r.m.s. by order (all channels get the same number of windows). */
export function makeSheet(key: string, spec: AnalysisSpec, context: EvaluationContext = {}, series?: Record<string, Record<number, number[]>>): SheetReport {
  const result = judgeWithSeed(withSeries(makeAnalysis(spec), series), key, context);
  return {
    capture: {
      id: "00000000-0000-4000-8000-000000000001",
      title: "Bench B kettle, run 2",
      originalFilename: "kettle-run2.csv",
      capturedAt: new Date("2026-03-02T09:15:00Z"),
      createdAt: new Date("2026-03-02T10:00:00Z"),
      reviewState: "approved",
    },
    site: { name: "Bench B — product compliance lab", nominalVoltageV: 230, frequencyHz: 50 },
    uploaderName: "Priya Okonkwo-Hale",
    evaluation: {
      id: "00000000-0000-4000-8000-0000000000e1",
      verdict: result.verdict,
      limitSetKey: key,
      limitSetName: result.limitSet.name,
      revisionNumber: 1,
      createdAt: new Date("2026-03-02T10:01:00Z"),
      createdByName: null,
      result,
    },
    reviews: [
      { action: "submitted", comment: "", createdAt: new Date("2026-03-02T10:05:00Z"), actorName: "Priya Okonkwo-Hale" },
      { action: "approved", comment: "h3 excess confirmed, filter ordered", createdAt: new Date("2026-03-02T11:00:00Z"), actorName: "Teodor Vance" },
    ],
  };
}

/** Adds per-window order series (orders not given stay at their capture value in every window). */
function withSeries(analysis: AnalysisResult, series?: Record<string, Record<number, number[]>>): AnalysisResult {
  if (!series) return analysis;
  const count = Math.max(...Object.values(series).flatMap((byOrder) => Object.values(byOrder).map((v) => v.length)));
  return {
    ...analysis,
    window: { ...analysis.window, count },
    channels: analysis.channels.map((c) => ({
      ...c,
      harmonicSeries: c.harmonics.map((h) => series[c.name]?.[h.order] ?? (h.rms === null ? null : Array.from({ length: count }, () => h.rms as number))),
    })),
  };
}
