import { index, jsonb, pgTable, text } from "drizzle-orm/pg-core";
import { users } from "./auth";
import { createdAtColumn, idColumn } from "./columns";

// Append-only record of who changed what.
export const auditEvents = pgTable(
  "audit_events",
  {
    id: idColumn(),
    actorId: text("actor_id").references(() => users.id),
    action: text("action").notNull(),
    entityType: text("entity_type").notNull(),
    entityId: text("entity_id"),
    details: jsonb("details").$type<Record<string, unknown>>().notNull().default({}),
    createdAt: createdAtColumn(),
  },
  (t) => [index("audit_events_entity_idx").on(t.entityType, t.entityId)],
);

export type AuditEvent = typeof auditEvents.$inferSelect;
