// Seeds the published limit tables (lib/compliance/seed) as revision 1 of each set.
// A set that already exists is left alone: admins' later revisions are never overwritten.
import { eq } from "drizzle-orm";
import type { PostgresJsDatabase } from "drizzle-orm/postgres-js";
import { seedLimitSets } from "@/lib/compliance/seed";
import * as schema from "@/db/schema";

export async function seedLimitTables(db: PostgresJsDatabase<typeof schema>): Promise<void> {
  for (const set of seedLimitSets) {
    const [existing] = await db.select().from(schema.limitSets).where(eq(schema.limitSets.key, set.key));
    if (existing) continue;
    await db.transaction(async (tx) => {
      const [row] = await tx
        .insert(schema.limitSets)
        .values({ key: set.key, name: set.name, standard: set.content.standard, edition: set.content.edition })
        .returning();
      const [rev] = await tx
        .insert(schema.limitSetRevisions)
        .values({ limitSetId: row!.id, number: 1, content: set.content, reason: "Seeded from the published table" })
        .returning();
      await tx.update(schema.limitSets).set({ currentRevisionId: rev!.id }).where(eq(schema.limitSets.id, row!.id));
    });
  }
}
