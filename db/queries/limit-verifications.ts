import "server-only";
import { and, desc, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { limitSetRevisions, limitSets, limitSetVerifications } from "@/db/schema";
import { AppError } from "@/lib/errors";
import type { RevisionVerification } from "@/lib/reports/limits-line";
import type { LimitVerificationInput } from "@/lib/validations/limit-verification";
import { insertAuditEvent } from "./audit";

export interface VerificationView extends RevisionVerification {
  note: string;
  createdAt: Date;
}

/** A verification as sheets and the limit-table screens show it. */
export const verificationColumns = {
  edition: limitSetVerifications.edition,
  checked: limitSetVerifications.checked,
  verifiedByName: limitSetVerifications.verifiedByName,
  verifiedOn: limitSetVerifications.verifiedOn,
  note: limitSetVerifications.note,
  createdAt: limitSetVerifications.createdAt,
};

async function revisionId(key: string, number: number): Promise<string> {
  const [row] = await db
    .select({ id: limitSetRevisions.id })
    .from(limitSetRevisions)
    .innerJoin(limitSets, eq(limitSets.id, limitSetRevisions.limitSetId))
    .where(and(eq(limitSets.key, key), eq(limitSetRevisions.number, number)));
  if (!row) throw new AppError("not_found", `Limit set ${key} has no revision ${number}.`);
  return row.id;
}

/** Every verification of a revision, newest first (the limit-table screens). */
export async function listRevisionVerifications({ key, number }: { key: string; number: number }): Promise<VerificationView[]> {
  const id = await revisionId(key, number);
  return db.select(verificationColumns).from(limitSetVerifications).where(eq(limitSetVerifications.revisionId, id)).orderBy(desc(limitSetVerifications.createdAt));
}

/** Records that `actor` checked a revision against the printed edition. The revision itself is not touched. */
export async function verifyRevision({
  key,
  number,
  input,
  actor,
}: {
  key: string;
  number: number;
  input: LimitVerificationInput;
  actor: { id: string; name: string };
}): Promise<VerificationView> {
  const id = await revisionId(key, number);
  return db.transaction(async (tx) => {
    const [row] = await tx
      .insert(limitSetVerifications)
      .values({ revisionId: id, ...input, verifiedById: actor.id, verifiedByName: actor.name })
      .returning(verificationColumns);
    await insertAuditEvent(tx, { actorId: actor.id, action: "limit_set.verify", entityType: "limit_set_revision", entityId: id, details: { key, number, ...input } });
    return row!;
  });
}
