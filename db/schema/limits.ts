import { boolean, integer, jsonb, pgTable, text, timestamp, unique, uuid } from "drizzle-orm/pg-core";
import { users } from "./auth";

export const limitSets = pgTable("limit_sets", {
  id: uuid("id").primaryKey().defaultRandom(),
  key: text("key").notNull().unique(),
  name: text("name").notNull(),
  standard: text("standard").notNull(),
  edition: text("edition").notNull(),
  // Sets cloned by an admin (e.g. a utility's own limits) are custom; seeded ones are published.
  custom: boolean("custom").notNull().default(false),
  currentRevisionId: uuid("current_revision_id"),
  createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
});

// A revision's content is immutable: an edit always inserts a new revision.
export const limitSetRevisions = pgTable(
  "limit_set_revisions",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    limitSetId: uuid("limit_set_id")
      .notNull()
      .references(() => limitSets.id, { onDelete: "cascade" }),
    number: integer("number").notNull(),
    // Validated by LimitSetRevisionContentSchema (lib/compliance/model.ts).
    content: jsonb("content").$type<unknown>().notNull(),
    reason: text("reason").notNull(),
    authorId: text("author_id").references(() => users.id),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [unique("limit_set_revisions_set_number").on(t.limitSetId, t.number)],
);

export type LimitSet = typeof limitSets.$inferSelect;
export type LimitSetRevision = typeof limitSetRevisions.$inferSelect;
