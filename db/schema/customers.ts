import { index, pgTable, primaryKey, text } from "drizzle-orm/pg-core";
import { users } from "./auth";
import { createdAtColumn, idColumn, requiredRef } from "./columns";

// An organisation that owns sites (a facility operator, an equipment maker). Outside readers
// (viewers) belong to one or more customers and read only the approved sheets of those sites.
export const customers = pgTable("customers", {
  id: idColumn(),
  name: text("name").notNull().unique(),
  createdAt: createdAtColumn(),
});

// Which viewers belong to which customer.
export const customerMembers = pgTable(
  "customer_members",
  {
    customerId: requiredRef("customer_id", () => customers.id, "cascade"),
    userId: text("user_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
  },
  // By user: the viewers' visibility filter looks up a user's customers on every request.
  (t) => [primaryKey({ columns: [t.customerId, t.userId] }), index("customer_members_user_idx").on(t.userId)],
);

export type Customer = typeof customers.$inferSelect;
