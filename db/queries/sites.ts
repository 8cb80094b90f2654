import "server-only";
import { and, asc, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { sites, type Site } from "@/db/schema";
import type { Reader } from "@/lib/auth/permissions";
import { AppError } from "@/lib/errors";
import type { SiteInput } from "@/lib/validations/site";
import { insertAuditEvent } from "./audit";
import { sitesVisibleTo } from "./scope";

/** A site as a JSON answer carries it: without the interval-log mapping remembered for it and who created it (internal). */
export type SiteView = Omit<Site, "intervalMapping" | "createdBy">;

export function toSiteView({ intervalMapping: _mapping, createdBy: _createdBy, ...site }: Site): SiteView {
  return site;
}

/** The sites `reader` may see (viewers: their customers' sites only), by name. */
export function listSites({ reader }: { reader: Reader }): Promise<Site[]> {
  return db.select().from(sites).where(sitesVisibleTo(reader)).orderBy(asc(sites.name));
}

/** One site as `reader` may see it; otherwise not found. */
export async function getSiteById({ id, reader }: { id: string; reader: Reader }): Promise<Site> {
  const [site] = await db.select().from(sites).where(and(eq(sites.id, id), sitesVisibleTo(reader)));
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
