import "server-only";
import { and, asc, eq, inArray, ne } from "drizzle-orm";
import { db } from "@/db/client";
import { customerMembers, customers, sites, users } from "@/db/schema";
import { AppError } from "@/lib/errors";
import type { UpdateCustomerInput } from "@/lib/validations/customer";
import { insertAuditEvent } from "./audit";

export interface CustomerListItem {
  id: string;
  name: string;
  siteIds: string[];
  viewerIds: string[];
}

/** Every customer with the sites it owns and the viewers who belong to it (admin screen). Three queries. */
export async function listCustomers(): Promise<CustomerListItem[]> {
  const [rows, owned, members] = await Promise.all([
    db.select({ id: customers.id, name: customers.name }).from(customers).orderBy(asc(customers.name)),
    db.select({ id: sites.id, customerId: sites.customerId }).from(sites),
    db.select().from(customerMembers),
  ]);
  return rows.map((c) => ({
    ...c,
    siteIds: owned.filter((s) => s.customerId === c.id).map((s) => s.id),
    viewerIds: members.filter((m) => m.customerId === c.id).map((m) => m.userId),
  }));
}

export async function createCustomer({ name, actorId }: { name: string; actorId: string }): Promise<{ id: string; name: string }> {
  return db.transaction(async (tx) => {
    const [existing] = await tx.select({ id: customers.id }).from(customers).where(eq(customers.name, name));
    if (existing) throw new AppError("validation", "A customer with this name exists", { name: ["A customer with this name exists"] });
    const [c] = await tx.insert(customers).values({ name }).returning({ id: customers.id, name: customers.name });
    await insertAuditEvent(tx, { actorId, action: "customer.create", entityType: "customer", entityId: c!.id, details: { name } });
    return c!;
  });
}

/**
 * Sets a customer's name, the sites it owns (taking them from any other customer) and its viewers.
 * Only users with the viewer role can be members: staff see everything anyway.
 */
export async function updateCustomer({ id, input, actorId }: { id: string; input: UpdateCustomerInput; actorId: string }): Promise<CustomerListItem> {
  return db.transaction(async (tx) => {
    const [c] = await tx.select({ id: customers.id }).from(customers).where(eq(customers.id, id)).for("update");
    if (!c) throw new AppError("not_found", "No such customer.");
    const [clash] = await tx.select({ id: customers.id }).from(customers).where(and(eq(customers.name, input.name), ne(customers.id, id)));
    if (clash) throw new AppError("validation", "A customer with this name exists", { name: ["A customer with this name exists"] });
    const siteIds = [...new Set(input.siteIds)];
    const viewerIds = [...new Set(input.viewerIds)];
    if (siteIds.length > 0) {
      const found = await tx.select({ id: sites.id }).from(sites).where(inArray(sites.id, siteIds));
      if (found.length !== siteIds.length) throw new AppError("validation", "Unknown site", { siteIds: ["One of the sites does not exist"] });
    }
    if (viewerIds.length > 0) {
      const found = await tx.select({ id: users.id, role: users.role }).from(users).where(inArray(users.id, viewerIds));
      if (found.length !== viewerIds.length) throw new AppError("validation", "Unknown user", { viewerIds: ["One of the users does not exist"] });
      if (found.some((u) => u.role !== "viewer")) throw new AppError("validation", "Only viewers belong to customers", { viewerIds: ["Only users with the viewer role can belong to a customer"] });
    }
    await tx.update(customers).set({ name: input.name }).where(eq(customers.id, id));
    await tx.update(sites).set({ customerId: null }).where(eq(sites.customerId, id));
    if (siteIds.length > 0) await tx.update(sites).set({ customerId: id }).where(inArray(sites.id, siteIds));
    await tx.delete(customerMembers).where(eq(customerMembers.customerId, id));
    if (viewerIds.length > 0) await tx.insert(customerMembers).values(viewerIds.map((userId) => ({ customerId: id, userId })));
    await insertAuditEvent(tx, { actorId, action: "customer.update", entityType: "customer", entityId: id, details: { ...input } });
    return { id, name: input.name, siteIds, viewerIds };
  });
}
