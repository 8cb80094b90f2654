import { boolean, index, jsonb, pgTable, text, uuid } from "drizzle-orm/pg-core";
import type { MitigationStudyInputs } from "@/lib/mitigation/study-inputs";
import type { WhatIfResult } from "@/lib/mitigation/types";
import { users } from "./auth";
import { captures } from "./captures";
import { analyses, evaluations } from "./results";
import { createdAtColumn, idColumn, requiredRef } from "./columns";

// A saved mitigation study: a what-if prediction an engineer kept with a capture. Stored with the
// inputs and the model version so it can be read (and recomputed) later; never edited.
export const mitigationStudies = pgTable(
  "mitigation_studies",
  {
    id: idColumn(),
    captureId: requiredRef("capture_id", () => captures.id, "cascade"),
    analysisId: requiredRef("analysis_id", () => analyses.id, "cascade"),
    // The evaluation whose limit-set revision and context the prediction was judged against.
    evaluationId: uuid("evaluation_id").references(() => evaluations.id, { onDelete: "set null" }),
    title: text("title").notNull(),
    modelVersion: text("model_version").notNull(),
    inputs: jsonb("inputs").$type<MitigationStudyInputs>().notNull(),
    result: jsonb("result").$type<WhatIfResult>().notNull(),
    // pass | fail | incomplete | none (no limit set to judge against)
    predictedVerdict: text("predicted_verdict").notNull(),
    includeInReport: boolean("include_in_report").notNull().default(false),
    createdBy: text("created_by").references(() => users.id),
    createdAt: createdAtColumn(),
  },
  (t) => [index("mitigation_studies_capture_idx").on(t.captureId)],
);

export type MitigationStudy = typeof mitigationStudies.$inferSelect;
