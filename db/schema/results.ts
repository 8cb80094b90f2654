import { customType, index, integer, json, jsonb, pgTable, primaryKey, text, timestamp, uuid } from "drizzle-orm/pg-core";
import type { AnalysisResult } from "@/lib/analysis/types";
import type { ChannelCompliance, ComplianceResult } from "@/lib/compliance/result";
import type { AnalysisSummary } from "@/lib/reports/analysis-summary";
import type { ChartData } from "@/lib/reports/chart-data";
import type { ResultHead } from "@/lib/reports/result-head";
import type { IntervalTrend } from "@/lib/intervals/evaluate-interval-log";
import { users } from "./auth";
import { captures } from "./captures";
import { reviewActionEnum } from "./enums";
import { limitSetRevisions } from "./limits";
import { createdAtColumn, idColumn, requiredRef } from "./columns";

/** PostgreSQL `bytea`, read and written as a Buffer. */
const bytea = customType<{ data: Buffer; driverData: Buffer }>({ dataType: () => "bytea" });

// One row per analysis run of a capture; the newest is the one the sheet shows.
export const analyses = pgTable(
  "analyses",
  {
    id: idColumn(),
    captureId: requiredRef("capture_id", () => captures.id, "cascade"),
    // The whole engine result including the per-window series for the charts.
    result: jsonb("result").$type<AnalysisResult>().notNull(),
    // A few cycles of each channel's samples for the waveform chart.
    // Interval logs: per-channel trend series with their limits (lib/intervals).
    trends: jsonb("trends").$type<IntervalTrend[]>(),
    waveform: jsonb("waveform").$type<{ timeS: number[]; channels: { name: string; values: number[] }[] }>(),
    // The result without its per-order and per-window arrays (lib/reports/analysis-summary.ts), written with
    // the analysis: what the sheet, PDF and CSV read for the headline numbers. \`json\`: read back as written.
    summary: json("summary").$type<AnalysisSummary>(),
    // The set-up this analysis ran with (mapping, scales, sample interval), who saved it, and the file's SHA-256.
    setup: jsonb("setup").$type<Record<string, unknown>>(),
    setupBy: text("setup_by").references(() => users.id),
    fileSha256: text("file_sha256"),
    createdBy: text("created_by").references(() => users.id),
    createdAt: createdAtColumn(),
  },
  (t) => [index("analyses_capture_idx").on(t.captureId)],
);

// A judgement of an analysis against one limit-set revision in one context. Re-judging makes a new row.
export const evaluations = pgTable(
  "evaluations",
  {
    id: idColumn(),
    captureId: requiredRef("capture_id", () => captures.id, "cascade"),
    analysisId: requiredRef("analysis_id", () => analyses.id, "cascade"),
    limitSetRevisionId: requiredRef("limit_set_revision_id", () => limitSetRevisions.id, "restrict"),
    context: jsonb("context").$type<Record<string, unknown>>().notNull(),
    // \`json\`, not \`jsonb\`: both documents are written once and read whole (never queried inside), and a
    // \`json\` value comes back as the stored text without conversion — the charts route sends it as it is.
    result: json("result").$type<ComplianceResult>().notNull(),
    verdict: text("verdict").notNull(),
    // The charts' data (lib/reports/chart-data.ts), built when the evaluation is stored; null for older rows.
    charts: json("charts").$type<ChartData>(),
    // The same JSON text gzipped (lib/reports/stored-gzip.ts): what the charts route sends, as it is, to a client
    // that accepts gzip (every browser) — no serialising or compressing per request. Null for older rows until
    // their first read.
    chartsGzip: bytea("charts_gzip"),
    createdBy: text("created_by").references(() => users.id),
    createdAt: createdAtColumn(),
  },
  (t) => [index("evaluations_capture_idx").on(t.captureId)],
);

// An evaluation's result split for the sheet page (lib/reports/result-head.ts), written with the evaluation (or
// on the first view of one stored before): part 0 is the head, parts 1… the channel blocks, worst first, so a
// page reads the head and one channel. Derived data: never updated (migration 0008 refuses it).
export const evaluationSheetParts = pgTable(
  "evaluation_sheet_parts",
  {
    evaluationId: uuid("evaluation_id")
      .notNull()
      .references(() => evaluations.id, { onDelete: "cascade" }),
    part: integer("part").notNull(),
    // The channel of a channel part; null for the head.
    channel: text("channel"),
    data: json("data").$type<ResultHead | ChannelCompliance>().notNull(),
  },
  (t) => [primaryKey({ columns: [t.evaluationId, t.part] })],
);

// The sheet body of a channel part (lib/reports/sheet-body-data.ts) as the JSON the signed-in sheet's client
// loads, gzipped: written with each new evaluation and, for the ones stored before, on their first read; sent
// as stored. Derived data: never updated (migration 0010 refuses it).
export const evaluationSheetBodies = pgTable(
  "evaluation_sheet_bodies",
  {
    evaluationId: uuid("evaluation_id")
      .notNull()
      .references(() => evaluations.id, { onDelete: "cascade" }),
    // The channel part (evaluation_sheet_parts.part, 1…) the body shows.
    part: integer("part").notNull(),
    gzip: bytea("gzip").notNull(),
  },
  (t) => [primaryKey({ columns: [t.evaluationId, t.part] })],
);

export const reviewEvents = pgTable(
  "review_events",
  {
    id: idColumn(),
    captureId: requiredRef("capture_id", () => captures.id, "cascade"),
    evaluationId: uuid("evaluation_id").references(() => evaluations.id, { onDelete: "set null" }),
    actorId: text("actor_id").references(() => users.id),
    action: reviewActionEnum("action").notNull(),
    comment: text("comment").notNull().default(""),
    createdAt: createdAtColumn(),
  },
  (t) => [index("review_events_capture_idx").on(t.captureId)],
);

export const shareLinks = pgTable("share_links", {
  id: idColumn(),
  captureId: requiredRef("capture_id", () => captures.id, "cascade"),
  tokenHash: text("token_hash").notNull().unique(),
  label: text("label").notNull().default(""),
  createdBy: text("created_by").references(() => users.id),
  expiresAt: timestamp("expires_at", { withTimezone: true }).notNull(),
  revokedAt: timestamp("revoked_at", { withTimezone: true }),
  createdAt: createdAtColumn(),
});

export type Analysis = typeof analyses.$inferSelect;
export type Evaluation = typeof evaluations.$inferSelect;
export type ReviewEvent = typeof reviewEvents.$inferSelect;
export type ShareLink = typeof shareLinks.$inferSelect;
