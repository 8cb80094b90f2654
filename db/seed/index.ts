// Idempotent seed: demo accounts, demo sites and the published limit tables.
// Run by scripts/setup-db.ts on every start; existing rows are left as they are.
import { hash } from "@node-rs/argon2";
import { count, eq, inArray } from "drizzle-orm";
import type { PostgresJsDatabase } from "drizzle-orm/postgres-js";
import { generateIdFromEntropySize } from "lucia";
import * as schema from "@/db/schema";
import { demoCustomers, demoPassword, demoSites, demoUsers, renamedDemoUsers } from "./scenario";
import { seedLimitTables } from "./limits";

type SeedDb = PostgresJsDatabase<typeof schema>;

export async function seed(db: SeedDb): Promise<void> {
  const passwordHash = await hash(demoPassword, { memoryCost: 19456, timeCost: 2, parallelism: 1, outputLen: 32 });
  for (const u of demoUsers) {
    const [existing] = await db.select().from(schema.users).where(eq(schema.users.email, u.email));
    if (!existing) await db.insert(schema.users).values({ id: generateIdFromEntropySize(10), ...u, passwordHash });
    // A demo account still under an earlier scenario's name gets the current one (a name someone changed stays).
    else if (existing.name === renamedDemoUsers[u.email]) await db.update(schema.users).set({ name: u.name }).where(eq(schema.users.id, existing.id));
  }
  const [{ n } = { n: 0 }] = await db.select({ n: count() }).from(schema.sites);
  if (n === 0) {
    const [admin] = await db.select().from(schema.users).where(eq(schema.users.email, "admin@ordwise.test"));
    await db.insert(schema.sites).values(demoSites.map((s) => ({ ...s, createdBy: admin?.id ?? null })));
  }
  await seedCustomers(db);
  await seedLimitTables(db);
}

/** The demo customers, once (when there are none yet): their sites and viewers, matched by name and e-mail. */
async function seedCustomers(db: SeedDb): Promise<void> {
  const [{ n } = { n: 0 }] = await db.select({ n: count() }).from(schema.customers);
  if (n > 0) return;
  for (const c of demoCustomers) {
    const [row] = await db.insert(schema.customers).values({ name: c.name }).returning({ id: schema.customers.id });
    if (!row) continue;
    if (c.siteNames.length > 0) await db.update(schema.sites).set({ customerId: row.id }).where(inArray(schema.sites.name, c.siteNames));
    if (c.viewerEmails.length === 0) continue;
    const members = await db.select({ id: schema.users.id }).from(schema.users).where(inArray(schema.users.email, c.viewerEmails));
    if (members.length > 0) await db.insert(schema.customerMembers).values(members.map((m) => ({ customerId: row.id, userId: m.id })));
  }
}
