import { boolean, index, jsonb, pgTable, text, timestamp, uuid } from "drizzle-orm/pg-core";
import type { MitigationStudyInputs } from "@/lib/mitigation/study-inputs";
import type { WhatIfResult } from "@/lib/mitigation/types";
import { users } from "./auth";
import { captures } from "./captures";
import { analyses, evaluations } from "./results";

// A saved mitigation study: a what-if prediction an engineer kept with a capture. Stored with the
// inputs and the model version so it can be read (and recomputed) later; never edited.
export const mitigationStudies = pgTable(
  "mitigation_studies",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    captureId: uuid("capture_id")
      .notNull()
      .references(() => captures.id, { onDelete: "cascade" }),
    analysisId: uuid("analysis_id")
      .notNull()
      .references(() => analyses.id, { onDelete: "cascade" }),
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
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("mitigation_studies_capture_idx").on(t.captureId)],
);

export type MitigationStudy = typeof mitigationStudies.$inferSelect;
