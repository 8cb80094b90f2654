// Seeds the published limit tables (lib/compliance/seed) as revisions of each set.
// A new set gets revision 1. When the seed files change later (a corrected cell, a new rule),
// the set gets a new revision — but only while its current revision is a seeded one: a set an
// admin has revised is never overwritten. Older revisions, and the evaluations pinned to them, stay.
import { isDeepStrictEqual } from "node:util";
import { and, desc, eq } from "drizzle-orm";
import type { PostgresJsDatabase } from "drizzle-orm/postgres-js";
import { seedLimitSets } from "@/lib/compliance/seed";
import * as schema from "@/db/schema";

const firstReason = "Seeded from the published table";
const updateReason = "Seed data updated (published table)";

export async function seedLimitTables(db: PostgresJsDatabase<typeof schema>): Promise<void> {
  for (const set of seedLimitSets()) {
    await db.transaction(async (tx) => {
      const [existing] = await tx.select().from(schema.limitSets).where(eq(schema.limitSets.key, set.key)).for("update");
      if (!existing) {
        const [row] = await tx
          .insert(schema.limitSets)
          .values({ key: set.key, name: set.name, standard: set.content.standard, edition: set.content.edition })
          .returning();
        const [rev] = await tx
          .insert(schema.limitSetRevisions)
          .values({ limitSetId: row!.id, number: 1, content: set.content, reason: firstReason })
          .returning();
        await tx.update(schema.limitSets).set({ currentRevisionId: rev!.id }).where(eq(schema.limitSets.id, row!.id));
        return;
      }
      const [latest] = await tx
        .select()
        .from(schema.limitSetRevisions)
        .where(eq(schema.limitSetRevisions.limitSetId, existing.id))
        .orderBy(desc(schema.limitSetRevisions.number))
        .limit(1);
      const seededLast = latest && latest.authorId === null && (latest.reason === firstReason || latest.reason === updateReason);
      if (!latest || !seededLast || latest.id !== existing.currentRevisionId) return;
      if (isDeepStrictEqual(JSON.parse(JSON.stringify(latest.content)), JSON.parse(JSON.stringify(set.content)))) return;
      const [rev] = await tx
        .insert(schema.limitSetRevisions)
        .values({ limitSetId: existing.id, number: latest.number + 1, content: set.content, reason: updateReason })
        .returning();
      await tx
        .update(schema.limitSets)
        .set({ currentRevisionId: rev!.id })
        .where(and(eq(schema.limitSets.id, existing.id), eq(schema.limitSets.currentRevisionId, latest.id)));
    });
  }
}
