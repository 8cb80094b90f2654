// A loaded sheet built by hand around a real evaluation, for the report builder tests.
import { complianceForCli } from "@/lib/compliance/compliance-for-cli";
import type { EvaluationContext } from "@/lib/compliance/model";
import type { SheetReport } from "@/lib/reports/sheet-report";
import { makeAnalysis, type AnalysisSpec } from "../compliance/make-analysis";

export function makeSheet(key: string, spec: AnalysisSpec, context: EvaluationContext = {}): SheetReport {
  const result = complianceForCli(makeAnalysis(spec), key, context).compliance;
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
