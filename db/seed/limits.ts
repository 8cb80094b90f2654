// Seeds the published limit tables (lib/compliance/seed) as revision 1 of each set.
import type { PostgresJsDatabase } from "drizzle-orm/postgres-js";
import type * as schema from "@/db/schema";

export async function seedLimitTables(_db: PostgresJsDatabase<typeof schema>): Promise<void> {
  // Filled in when the compliance model lands.
}
