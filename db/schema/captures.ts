import { bigint, index, integer, jsonb, pgTable, text, timestamp, uuid } from "drizzle-orm/pg-core";
import { users } from "./auth";
import { captureKindEnum, captureStatusEnum, reviewStateEnum } from "./enums";
import { sites } from "./sites";
import { createdAtColumn, idColumn, requiredRef } from "./columns";

export const captures = pgTable(
  "captures",
  {
    id: idColumn(),
    siteId: requiredRef("site_id", () => sites.id, "restrict"),
    title: text("title").notNull(),
    // A waveform record (scope/analyser samples) or an interval log (per-interval values from a logger).
    kind: captureKindEnum("kind").notNull().default("waveform"),
    // Key of the original upload in the bucket; the object is never modified.
    s3Key: text("s3_key").notNull(),
    originalFilename: text("original_filename").notNull(),
    sizeBytes: bigint("size_bytes", { mode: "number" }).notNull().default(0),
    status: captureStatusEnum("status").notNull().default("uploading"),
    // 0–100 while the analysis runs.
    progressPercent: integer("progress_percent").notNull().default(0),
    reviewState: reviewStateEnum("review_state").notNull().default("draft"),
    // Key of the limit set the capture is judged against by default.
    limitSetKey: text("limit_set_key"),
    // User-facing reason when status is "failed".
    failureReason: text("failure_reason"),
    // Channel mapping and evaluation context chosen by the technician.
    mapping: jsonb("mapping").$type<Record<string, unknown>>(),
    context: jsonb("context").$type<Record<string, unknown>>(),
    // Who last saved the mapping/context (the four-eyes rule keeps them from approving the result).
    setupBy: text("setup_by").references(() => users.id),
    // SHA-256 (hex) of the original, computed by the server when the upload is confirmed; checked before every analysis.
    sha256: text("sha256"),
    // The evaluation an engineer approved; share links, the PDF and viewers show it while it exists.
    approvedEvaluationId: uuid("approved_evaluation_id"),
    // Withdrawn by its uploader before submission: hidden from lists, kept for the audit log.
    withdrawnAt: timestamp("withdrawn_at", { withTimezone: true }),
    capturedAt: timestamp("captured_at", { withTimezone: true }),
    uploadedBy: text("uploaded_by").references(() => users.id),
    createdAt: createdAtColumn(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  // The site's captures: lists by site and the viewers' visibility filter (db/queries/scope.ts).
  (t) => [index("captures_site_idx").on(t.siteId)],
);

export type Capture = typeof captures.$inferSelect;
export type NewCapture = typeof captures.$inferInsert;
