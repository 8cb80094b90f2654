import { doublePrecision, index, jsonb, pgTable, text, timestamp, uuid } from "drizzle-orm/pg-core";
import { users } from "./auth";
import { customers } from "./customers";
import { createdAtColumn, idColumn } from "./columns";

// A site is where captures are taken: a facility's PCC or a test bench for equipment.
export const sites = pgTable(
  "sites",
  {
    id: idColumn(),
    name: text("name").notNull(),
    address: text("address").notNull().default(""),
    nominalVoltageV: doublePrecision("nominal_voltage_v").notNull(),
    frequencyHz: doublePrecision("frequency_hz").notNull(),
    // Maximum short-circuit current and maximum demand load current at the PCC (IEEE 519 terms).
    iscA: doublePrecision("isc_a"),
    ilA: doublePrecision("il_a"),
    notes: text("notes").notNull().default(""),
    // The organisation that owns the site; null for the lab's own benches. Viewers read only their customers' sites.
    customerId: uuid("customer_id").references(() => customers.id, { onDelete: "set null" }),
    // The column mapping last used for this site's interval logs, offered again for the next one.
    intervalMapping: jsonb("interval_mapping").$type<Record<string, unknown>>(),
    createdBy: text("created_by").references(() => users.id),
    createdAt: createdAtColumn(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  // By customer: the viewers' visibility filter (db/queries/scope.ts).
  (t) => [index("sites_customer_idx").on(t.customerId)],
);

export type Site = typeof sites.$inferSelect;
export type NewSite = typeof sites.$inferInsert;
