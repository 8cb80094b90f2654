import "server-only";
import { and, desc, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { evaluations, limitSetRevisions, limitSets, mitigationStudies, users } from "@/db/schema";
import { LimitSetRevisionContentSchema, type LimitSetRevisionContent } from "@/lib/compliance/model";
import { AppError } from "@/lib/errors";
import type { MitigationStudyInputs } from "@/lib/mitigation/study-inputs";
import type { WhatIfResult } from "@/lib/mitigation/types";
import { insertAuditEvent } from "./audit";

/** A limit-set revision by its id, with its set's key and name (the revision an evaluation used). */
export async function getRevisionById({ id }: { id: string }): Promise<{ key: string; name: string; revisionId: string; revisionNumber: number; content: LimitSetRevisionContent }> {
  const [row] = await db
    .select({ key: limitSets.key, name: limitSets.name, revisionId: limitSetRevisions.id, revisionNumber: limitSetRevisions.number, content: limitSetRevisions.content })
    .from(limitSetRevisions)
    .innerJoin(limitSets, eq(limitSets.id, limitSetRevisions.limitSetId))
    .where(eq(limitSetRevisions.id, id));
  if (!row) throw new AppError("not_found", "The limit-set revision of this evaluation no longer exists.");
  return { ...row, content: LimitSetRevisionContentSchema.parse(row.content) };
}

/** Stores a mitigation study (and an audit entry) in one transaction; returns its id. */
export async function insertMitigationStudy({
  captureId,
  analysisId,
  evaluationId,
  title,
  inputs,
  result,
  includeInReport,
  actorId,
}: {
  captureId: string;
  analysisId: string;
  evaluationId: string | null;
  title: string;
  inputs: MitigationStudyInputs;
  result: WhatIfResult;
  includeInReport: boolean;
  actorId: string;
}): Promise<string> {
  return db.transaction(async (tx) => {
    const [row] = await tx
      .insert(mitigationStudies)
      .values({
        captureId,
        analysisId,
        evaluationId,
        title,
        modelVersion: result.modelVersion,
        inputs,
        result,
        predictedVerdict: result.compliance?.verdict ?? "none",
        includeInReport,
        createdBy: actorId,
      })
      .returning({ id: mitigationStudies.id });
    await insertAuditEvent(tx, { actorId, action: "study.saved", entityType: "capture", entityId: captureId, details: { studyId: row!.id, title } });
    return row!.id;
  });
}

/**
 * The saved studies of a capture, newest first, with their author's name and the evaluation each one
 * started from. `evaluationId`: only the studies started from that evaluation (what a reader outside
 * the team, a share link or a report of that evaluation may show).
 */
export async function listMitigationStudies({ captureId, onlyForReport = false, evaluationId }: { captureId: string; onlyForReport?: boolean; evaluationId?: string | null }) {
  // A reader restricted to one evaluation that does not exist (no approval yet) sees none.
  if (evaluationId === null) return [];
  return db
    .select({
      id: mitigationStudies.id,
      title: mitigationStudies.title,
      modelVersion: mitigationStudies.modelVersion,
      inputs: mitigationStudies.inputs,
      result: mitigationStudies.result,
      predictedVerdict: mitigationStudies.predictedVerdict,
      includeInReport: mitigationStudies.includeInReport,
      createdAt: mitigationStudies.createdAt,
      authorName: users.name,
      evaluationId: mitigationStudies.evaluationId,
      evaluationCreatedAt: evaluations.createdAt,
    })
    .from(mitigationStudies)
    .leftJoin(users, eq(users.id, mitigationStudies.createdBy))
    .leftJoin(evaluations, eq(evaluations.id, mitigationStudies.evaluationId))
    .where(
      and(
        eq(mitigationStudies.captureId, captureId),
        onlyForReport ? eq(mitigationStudies.includeInReport, true) : undefined,
        evaluationId !== undefined ? eq(mitigationStudies.evaluationId, evaluationId) : undefined,
      ),
    )
    .orderBy(desc(mitigationStudies.createdAt));
}

export type SavedStudy = Awaited<ReturnType<typeof listMitigationStudies>>[number];
