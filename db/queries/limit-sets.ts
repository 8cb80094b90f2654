import "server-only";
import { and, asc, eq, sql } from "drizzle-orm";
import { db, type Tx } from "@/db/client";
import { limitSetRevisions, limitSets, users, type LimitSet } from "@/db/schema";
import { diffRevisions, type RevisionChange } from "@/lib/compliance/diff-revisions";
import type { LimitSetRevisionContent } from "@/lib/compliance/model";
import { AppError } from "@/lib/errors";
import { insertAuditEvent } from "./audit";

/** A row of the limit-set list. */
export interface LimitSetSummary {
  key: string;
  name: string;
  standard: string;
  edition: string;
  custom: boolean;
  currentRevisionNumber: number | null;
  updatedAt: Date | null;
}

/** One revision as the editor shows it. Content is returned as stored (revisions are immutable). */
export interface RevisionView {
  number: number;
  content: LimitSetRevisionContent;
  reason: string;
  authorName: string | null;
  createdAt: Date;
}

export interface RevisionHistoryEntry extends Omit<RevisionView, "content"> {
  current: boolean;
  /** Changes from the previous revision; empty for revision 1. */
  changes: RevisionChange[];
}

const summaryColumns = {
  key: limitSets.key,
  name: limitSets.name,
  standard: limitSets.standard,
  edition: limitSets.edition,
  custom: limitSets.custom,
  currentRevisionNumber: limitSetRevisions.number,
  updatedAt: limitSetRevisions.createdAt,
};

const revisionColumns = {
  number: limitSetRevisions.number,
  content: limitSetRevisions.content,
  reason: limitSetRevisions.reason,
  authorName: users.name,
  createdAt: limitSetRevisions.createdAt,
};

function toView(row: { number: number; content: unknown; reason: string; authorName: string | null; createdAt: Date }): RevisionView {
  // Stored content was validated on the way in; it is shown as stored, never re-defaulted.
  return { ...row, content: row.content as LimitSetRevisionContent };
}

export function listLimitSets(): Promise<LimitSetSummary[]> {
  return db
    .select(summaryColumns)
    .from(limitSets)
    .leftJoin(limitSetRevisions, eq(limitSetRevisions.id, limitSets.currentRevisionId))
    .orderBy(asc(limitSets.custom), asc(limitSets.key));
}

async function findSet(tx: typeof db | Tx, key: string, lock = false): Promise<LimitSet> {
  const query = tx.select().from(limitSets).where(eq(limitSets.key, key));
  // Locking the set row serialises concurrent revisions, so numbers never collide.
  const [set] = lock ? await query.for("update") : await query;
  if (!set) throw new AppError("not_found", `No limit set with key ${key}.`);
  return set;
}

/** A set's summary and its current revision. */
export async function getLimitSetByKey({ key }: { key: string }): Promise<{ limitSet: LimitSetSummary; revision: RevisionView }> {
  const [row] = await db
    .select({ ...summaryColumns, revision: revisionColumns })
    .from(limitSets)
    .innerJoin(limitSetRevisions, eq(limitSetRevisions.id, limitSets.currentRevisionId))
    .leftJoin(users, eq(users.id, limitSetRevisions.authorId))
    .where(eq(limitSets.key, key));
  if (!row) throw new AppError("not_found", `No limit set with key ${key}.`);
  const { revision, ...limitSet } = row;
  return { limitSet, revision: toView(revision) };
}

/** One revision of a set by number (any revision, current or not). */
export async function getRevisionByKeyAndNumber({ key, number }: { key: string; number: number }): Promise<{ limitSet: LimitSetSummary; revision: RevisionView }> {
  const { limitSet } = await getLimitSetByKey({ key });
  const [row] = await db
    .select(revisionColumns)
    .from(limitSetRevisions)
    .innerJoin(limitSets, eq(limitSets.id, limitSetRevisions.limitSetId))
    .leftJoin(users, eq(users.id, limitSetRevisions.authorId))
    .where(and(eq(limitSets.key, key), eq(limitSetRevisions.number, number)));
  if (!row) throw new AppError("not_found", `Limit set ${key} has no revision ${number}.`);
  return { limitSet, revision: toView(row) };
}

/** All revisions of a set, newest first, each with the cell changes from the one before. */
export async function listRevisionsByKey({ key }: { key: string }): Promise<{ limitSet: LimitSetSummary; revisions: RevisionHistoryEntry[] }> {
  const { limitSet } = await getLimitSetByKey({ key });
  const rows = await db
    .select(revisionColumns)
    .from(limitSetRevisions)
    .innerJoin(limitSets, eq(limitSets.id, limitSetRevisions.limitSetId))
    .leftJoin(users, eq(users.id, limitSetRevisions.authorId))
    .where(eq(limitSets.key, key))
    .orderBy(asc(limitSetRevisions.number));
  const revisions = rows.map(({ content, ...meta }, i) => ({
    ...meta,
    current: meta.number === limitSet.currentRevisionNumber,
    changes: i === 0 ? [] : diffRevisions(rows[i - 1]!.content, content),
  }));
  return { limitSet, revisions: revisions.reverse() };
}

async function insertRevision(
  tx: Tx,
  { set, content, reason, actorId }: { set: LimitSet; content: LimitSetRevisionContent; reason: string; actorId: string },
): Promise<number> {
  const [{ next }] = (await tx
    .select({ next: sql<number>`coalesce(max(${limitSetRevisions.number}), 0) + 1` })
    .from(limitSetRevisions)
    .where(eq(limitSetRevisions.limitSetId, set.id))) as [{ next: number }];
  const [rev] = await tx
    .insert(limitSetRevisions)
    .values({ limitSetId: set.id, number: Number(next), content, reason, authorId: actorId })
    .returning({ id: limitSetRevisions.id, number: limitSetRevisions.number });
  if (!rev) throw new AppError("internal", "The revision was not saved.");
  // The list shows standard and edition without opening the content, so they follow the current revision.
  await tx
    .update(limitSets)
    .set({ currentRevisionId: rev.id, standard: content.standard, edition: content.edition })
    .where(eq(limitSets.id, set.id));
  return rev.number;
}

/** Saves `content` as the next revision of set `key` and makes it current. */
export async function reviseLimitSetByKey({
  key,
  content,
  reason,
  actorId,
}: {
  key: string;
  content: LimitSetRevisionContent;
  reason: string;
  actorId: string;
}): Promise<{ limitSet: LimitSetSummary; revision: RevisionView }> {
  if (content.key !== key) throw new AppError("validation", "Some fields need attention.", { "content.key": [`key must stay "${key}"`] });
  await db.transaction(async (tx) => {
    const set = await findSet(tx, key, true);
    const number = await insertRevision(tx, { set, content, reason, actorId });
    await insertAuditEvent(tx, { actorId, action: "limit_set.revise", entityType: "limit_set", entityId: set.id, details: { key, number, reason } });
  });
  return getLimitSetByKey({ key });
}

async function createCustomSet(
  tx: Tx,
  { key, name, content, reason, actorId }: { key: string; name: string; content: LimitSetRevisionContent; reason: string; actorId: string },
): Promise<LimitSet> {
  const [set] = await tx
    .insert(limitSets)
    .values({ key, name, standard: content.standard, edition: content.edition, custom: true })
    .onConflictDoNothing({ target: limitSets.key })
    .returning();
  if (!set) throw new AppError("conflict", `A limit set with key ${key} exists already.`, { key: [`Key ${key} is taken`] });
  await insertRevision(tx, { set, content, reason, actorId });
  return set;
}

/** Copies the current content of set `key` into a new custom set `newKey` (its revision 1). */
export async function cloneLimitSetByKey({
  key,
  newKey,
  name,
  actorId,
}: {
  key: string;
  newKey: string;
  name: string;
  actorId: string;
}): Promise<{ limitSet: LimitSetSummary; revision: RevisionView }> {
  const source = await getLimitSetByKey({ key });
  await db.transaction(async (tx) => {
    const content = { ...source.revision.content, key: newKey };
    const reason = `Cloned from ${key} revision ${source.revision.number}`;
    const set = await createCustomSet(tx, { key: newKey, name, content, reason, actorId });
    await insertAuditEvent(tx, {
      actorId,
      action: "limit_set.clone",
      entityType: "limit_set",
      entityId: set.id,
      details: { key: newKey, name, from: key, fromRevision: source.revision.number },
    });
  });
  return getLimitSetByKey({ key: newKey });
}

/**
 * Imports an exported document: an existing key gets a new revision (reason required, name
 * updated), a new key becomes a new custom set.
 */
export async function importLimitSet({
  key,
  name,
  content,
  reason,
  actorId,
}: {
  key: string;
  name: string;
  content: LimitSetRevisionContent;
  reason?: string;
  actorId: string;
}): Promise<{ created: boolean; limitSet: LimitSetSummary; revision: RevisionView }> {
  const created = await db.transaction(async (tx) => {
    const [existing] = await tx.select().from(limitSets).where(eq(limitSets.key, key)).for("update");
    if (existing) {
      if (!reason) {
        throw new AppError("validation", "Some fields need attention.", {
          reason: [`Limit set ${key} exists: importing makes a new revision, so give a reason`],
        });
      }
      const number = await insertRevision(tx, { set: existing, content, reason, actorId });
      if (existing.name !== name) await tx.update(limitSets).set({ name }).where(eq(limitSets.id, existing.id));
      await insertAuditEvent(tx, { actorId, action: "limit_set.import", entityType: "limit_set", entityId: existing.id, details: { key, name, number, reason } });
      return false;
    }
    const set = await createCustomSet(tx, { key, name, content, reason: reason ?? "Imported from JSON", actorId });
    await insertAuditEvent(tx, { actorId, action: "limit_set.import", entityType: "limit_set", entityId: set.id, details: { key, name, number: 1, created: true } });
    return true;
  });
  return { created, ...(await getLimitSetByKey({ key })) };
}

/** The export document of a set: its key, name and current content. */
export async function exportLimitSetByKey({ key }: { key: string }): Promise<{ key: string; name: string; content: LimitSetRevisionContent }> {
  const { limitSet, revision } = await getLimitSetByKey({ key });
  return { key: limitSet.key, name: limitSet.name, content: revision.content };
}
