import { timestamp, uuid, type AnyPgColumn } from "drizzle-orm/pg-core";

// Column definitions the tables repeat, written once. Each call makes a fresh builder (drizzle needs one per table).

/** A random UUID primary key named "id". */
export const idColumn = () => uuid("id").primaryKey().defaultRandom();

/** When the row was inserted ("created_at", with time zone, set by the database). */
export const createdAtColumn = () => timestamp("created_at", { withTimezone: true }).notNull().defaultNow();

/** A required UUID reference to another table's row, deleted with it (`cascade`) or keeping it (`restrict`). */
export const requiredRef = (name: string, target: () => AnyPgColumn, onDelete: "cascade" | "restrict") =>
  uuid(name).notNull().references(target, { onDelete });
