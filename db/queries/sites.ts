import "server-only";
import { asc, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { sites, type Site } from "@/db/schema";
import { AppError } from "@/lib/errors";
import type { SiteInput } from "@/lib/validations/site";
import { insertAuditEvent } from "./audit";

export function listSites(): Promise<Site[]> {
  return db.select().from(sites).orderBy(asc(sites.name));
}

export async function getSiteById({ id }: { id: string }): Promise<Site> {
  const [site] = await db.select().from(sites).where(eq(sites.id, id));
  if (!site) throw new AppError("not_found", "No such site.");
  return site;
}

export function createSite({ input, actorId }: { input: SiteInput; actorId: string }): Promise<Site> {
  return db.transaction(async (tx) => {
    const [site] = await tx.insert(sites).values({ ...input, createdBy: actorId }).returning();
    if (!site) throw new AppError("internal", "The site was not saved.");
    await insertAuditEvent(tx, { actorId, action: "site.create", entityType: "site", entityId: site.id, details: { name: site.name } });
    return site;
  });
}

export function updateSite({ id, input, actorId }: { id: string; input: SiteInput; actorId: string }): Promise<Site> {
  return db.transaction(async (tx) => {
    const [site] = await tx.update(sites).set({ ...input, updatedAt: new Date() }).where(eq(sites.id, id)).returning();
    if (!site) throw new AppError("not_found", "No such site.");
    await insertAuditEvent(tx, { actorId, action: "site.update", entityType: "site", entityId: id, details: { ...input } });
    return site;
  });
}
