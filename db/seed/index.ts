// Idempotent seed: demo accounts, demo sites and the published limit tables.
// Run by scripts/setup-db.ts on every start; existing rows are left as they are.
import { hash } from "@node-rs/argon2";
import { count, eq } from "drizzle-orm";
import type { PostgresJsDatabase } from "drizzle-orm/postgres-js";
import { generateIdFromEntropySize } from "lucia";
import * as schema from "@/db/schema";
import { demoPassword, demoSites, demoUsers } from "./scenario";
import { seedLimitTables } from "./limits";

type SeedDb = PostgresJsDatabase<typeof schema>;

export async function seed(db: SeedDb): Promise<void> {
  const passwordHash = await hash(demoPassword, { memoryCost: 19456, timeCost: 2, parallelism: 1, outputLen: 32 });
  for (const u of demoUsers) {
    const [existing] = await db.select().from(schema.users).where(eq(schema.users.email, u.email));
    if (!existing) await db.insert(schema.users).values({ id: generateIdFromEntropySize(10), ...u, passwordHash });
  }
  const [{ n } = { n: 0 }] = await db.select({ n: count() }).from(schema.sites);
  if (n === 0) {
    const [admin] = await db.select().from(schema.users).where(eq(schema.users.email, "admin@ordwise.test"));
    await db.insert(schema.sites).values(demoSites.map((s) => ({ ...s, createdBy: admin?.id ?? null })));
  }
  await seedLimitTables(db);
}
