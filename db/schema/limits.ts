import { boolean, date, index, integer, jsonb, pgTable, text, unique, uuid } from "drizzle-orm/pg-core";
import { users } from "./auth";
import { createdAtColumn, idColumn, requiredRef } from "./columns";

export const limitSets = pgTable("limit_sets", {
  id: idColumn(),
  key: text("key").notNull().unique(),
  name: text("name").notNull(),
  standard: text("standard").notNull(),
  edition: text("edition").notNull(),
  // Sets cloned by an admin (e.g. a utility's own limits) are custom; seeded ones are published.
  custom: boolean("custom").notNull().default(false),
  currentRevisionId: uuid("current_revision_id"),
  createdAt: createdAtColumn(),
});

// A revision's content is immutable: an edit always inserts a new revision.
export const limitSetRevisions = pgTable(
  "limit_set_revisions",
  {
    id: idColumn(),
    limitSetId: requiredRef("limit_set_id", () => limitSets.id, "cascade"),
    number: integer("number").notNull(),
    // Validated by LimitSetRevisionContentSchema (lib/compliance/model.ts).
    content: jsonb("content").$type<unknown>().notNull(),
    reason: text("reason").notNull(),
    authorId: text("author_id").references(() => users.id),
    createdAt: createdAtColumn(),
  },
  (t) => [unique("limit_set_revisions_set_number").on(t.limitSetId, t.number)],
);

// Verification of a revision against the printed standard: a note added beside the immutable revision,
// never an edit of it. A revision without a row is "not yet verified"; the newest row counts.
export const limitSetVerifications = pgTable(
  "limit_set_verifications",
  {
    id: idColumn(),
    revisionId: requiredRef("revision_id", () => limitSetRevisions.id, "cascade"),
    // The printed edition held, e.g. "IEC 61000-3-2:2018 (Edition 5.0)".
    edition: text("edition").notNull(),
    // The clause or table checked row by row, e.g. "Table 1".
    checked: text("checked").notNull(),
    verifiedById: text("verified_by_id").references(() => users.id),
    // The verifier's name as printed on sheets (kept even if the account is renamed or removed).
    verifiedByName: text("verified_by_name").notNull(),
    verifiedOn: date("verified_on", { mode: "string" }).notNull(),
    note: text("note").notNull().default(""),
    createdAt: createdAtColumn(),
  },
  (t) => [index("limit_set_verifications_revision_idx").on(t.revisionId)],
);

export type LimitSet = typeof limitSets.$inferSelect;
export type LimitSetVerification = typeof limitSetVerifications.$inferSelect;
export type LimitSetRevision = typeof limitSetRevisions.$inferSelect;
