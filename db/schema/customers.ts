import { pgTable, primaryKey, text, timestamp, uuid } from "drizzle-orm/pg-core";
import { users } from "./auth";

// An organisation that owns sites (a facility operator, an equipment maker). Outside readers
// (viewers) belong to one or more customers and read only the approved sheets of those sites.
export const customers = pgTable("customers", {
  id: uuid("id").primaryKey().defaultRandom(),
  name: text("name").notNull().unique(),
  createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
});

// Which viewers belong to which customer.
export const customerMembers = pgTable(
  "customer_members",
  {
    customerId: uuid("customer_id")
      .notNull()
      .references(() => customers.id, { onDelete: "cascade" }),
    userId: text("user_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
  },
  (t) => [primaryKey({ columns: [t.customerId, t.userId] })],
);

export type Customer = typeof customers.$inferSelect;
