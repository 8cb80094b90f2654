import { index, jsonb, pgTable, text, timestamp, uuid } from "drizzle-orm/pg-core";
import type { AnalysisResult } from "@/lib/analysis/types";
import type { ComplianceResult } from "@/lib/compliance/result";
import type { ChartData } from "@/lib/reports/chart-data";
import type { IntervalTrend } from "@/lib/intervals/evaluate-interval-log";
import { users } from "./auth";
import { captures } from "./captures";
import { reviewActionEnum } from "./enums";
import { limitSetRevisions } from "./limits";

// One row per analysis run of a capture; the newest is the one the sheet shows.
export const analyses = pgTable(
  "analyses",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    captureId: uuid("capture_id")
      .notNull()
      .references(() => captures.id, { onDelete: "cascade" }),
    // The whole engine result including the per-window series for the charts.
    result: jsonb("result").$type<AnalysisResult>().notNull(),
    // A few cycles of each channel's samples for the waveform chart.
    // Interval logs: per-channel trend series with their limits (lib/intervals).
    trends: jsonb("trends").$type<IntervalTrend[]>(),
    waveform: jsonb("waveform").$type<{ timeS: number[]; channels: { name: string; values: number[] }[] }>(),
    // The set-up this analysis ran with (mapping, scales, sample interval), who saved it, and the file's SHA-256.
    setup: jsonb("setup").$type<Record<string, unknown>>(),
    setupBy: text("setup_by").references(() => users.id),
    fileSha256: text("file_sha256"),
    createdBy: text("created_by").references(() => users.id),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("analyses_capture_idx").on(t.captureId)],
);

// A judgement of an analysis against one limit-set revision in one context. Re-judging makes a new row.
export const evaluations = pgTable(
  "evaluations",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    captureId: uuid("capture_id")
      .notNull()
      .references(() => captures.id, { onDelete: "cascade" }),
    analysisId: uuid("analysis_id")
      .notNull()
      .references(() => analyses.id, { onDelete: "cascade" }),
    limitSetRevisionId: uuid("limit_set_revision_id")
      .notNull()
      .references(() => limitSetRevisions.id, { onDelete: "restrict" }),
    context: jsonb("context").$type<Record<string, unknown>>().notNull(),
    result: jsonb("result").$type<ComplianceResult>().notNull(),
    verdict: text("verdict").notNull(),
    // The charts' data (lib/reports/chart-data.ts), built when the evaluation is stored; null for older rows.
    charts: jsonb("charts").$type<ChartData>(),
    createdBy: text("created_by").references(() => users.id),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("evaluations_capture_idx").on(t.captureId)],
);

export const reviewEvents = pgTable(
  "review_events",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    captureId: uuid("capture_id")
      .notNull()
      .references(() => captures.id, { onDelete: "cascade" }),
    evaluationId: uuid("evaluation_id").references(() => evaluations.id, { onDelete: "set null" }),
    actorId: text("actor_id").references(() => users.id),
    action: reviewActionEnum("action").notNull(),
    comment: text("comment").notNull().default(""),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("review_events_capture_idx").on(t.captureId)],
);

export const shareLinks = pgTable("share_links", {
  id: uuid("id").primaryKey().defaultRandom(),
  captureId: uuid("capture_id")
    .notNull()
    .references(() => captures.id, { onDelete: "cascade" }),
  tokenHash: text("token_hash").notNull().unique(),
  label: text("label").notNull().default(""),
  createdBy: text("created_by").references(() => users.id),
  expiresAt: timestamp("expires_at", { withTimezone: true }).notNull(),
  revokedAt: timestamp("revoked_at", { withTimezone: true }),
  createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
});

export type Analysis = typeof analyses.$inferSelect;
export type Evaluation = typeof evaluations.$inferSelect;
export type ReviewEvent = typeof reviewEvents.$inferSelect;
export type ShareLink = typeof shareLinks.$inferSelect;
