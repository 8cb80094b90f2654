import "server-only";
import { auditEvents } from "@/db/schema";
import type { Db, Tx } from "@/db/client";

export async function insertAuditEvent(
  tx: Db | Tx,
  event: { actorId: string | null; action: string; entityType: string; entityId?: string | null; details?: Record<string, unknown> },
): Promise<void> {
  await tx.insert(auditEvents).values({
    actorId: event.actorId,
    action: event.action,
    entityType: event.entityType,
    entityId: event.entityId ?? null,
    details: event.details ?? {},
  });
}
