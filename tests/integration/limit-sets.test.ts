// The limit-table editor's API against the running app: revisions, validation, roles,
// clone/export/import, and evaluations keeping the revision they were judged against.
import { and, eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { analyses, auditEvents, captures, evaluations, limitSetRevisions, limitSets, sites } from "@/db/schema";
import type { LimitSetRevisionContent } from "@/lib/compliance/model";
import { Client, signedIn } from "../support/http";

interface Detail {
  limitSet: { key: string; name: string; custom: boolean; currentRevisionNumber: number; standard: string };
  revision: { number: number; content: LimitSetRevisionContent; reason: string; authorName: string | null };
}

const CLASS_A = "iec-61000-3-2-class-a";
let admin: Client;
let engineer: Client;
let viewer: Client;

const unique = (name: string) => `t-${name}-${Date.now().toString(36)}-${Math.floor(Math.random() * 1e6).toString(36)}`;

async function json<T>(res: Response): Promise<T> {
  return (await res.json()) as T;
}

/** A fresh custom copy of Class A so edits here never clash with other tests. */
async function cloneClassA(name: string): Promise<Detail> {
  const key = unique(name);
  const res = await admin.request("POST", `/api/limit-sets/${CLASS_A}/clone`, { key, name: `Class A copy ${name}` });
  expect(res.status).toBe(201);
  return json<Detail>(res);
}

beforeAll(async () => {
  admin = await signedIn("admin");
  engineer = await signedIn("engineer");
  viewer = await signedIn("viewer");
});

describe("reading limit sets", () => {
  it("lists the seeded published sets with their current revision", async () => {
    const res = await viewer.request("GET", "/api/limit-sets");
    expect(res.status).toBe(200);
    const { limitSets: list } = await json<{ limitSets: Detail["limitSet"][] }>(res);
    const classA = list.find((s) => s.key === CLASS_A);
    expect(classA).toMatchObject({ name: expect.any(String), standard: "IEC 61000-3-2", custom: false });
    expect(classA!.currentRevisionNumber).toBeGreaterThanOrEqual(1);
  });

  it("shows one set with its current content to any signed-in role; unknown keys are 404", async () => {
    const res = await engineer.request("GET", `/api/limit-sets/${CLASS_A}`);
    expect(res.status).toBe(200);
    const detail = await json<Detail>(res);
    expect(detail.revision.content.key).toBe(CLASS_A);
    expect(detail.revision.content.bands[0]!.label).toBe("Class A");
    expect((await viewer.request("GET", "/api/limit-sets/no-such-set")).status).toBe(404);
    expect((await viewer.request("GET", `/api/limit-sets/${CLASS_A}/revisions/999`)).status).toBe(404);
    expect((await new Client().request("GET", `/api/limit-sets/${CLASS_A}`)).status).toBe(401);
  });
});

describe("editing makes a new revision", () => {
  it("an admin edits a Class A cell with a reason: revision 2 is current, revision 1 unchanged", async () => {
    const { limitSet, revision } = await cloneClassA("edit");
    expect(revision.number).toBe(1);
    const content = structuredClone(revision.content);
    // Row 2 is order 5, 1.14 A (IEC 61000-3-2:2018+A1:2020 Table 1).
    expect(content.bands[0]!.orderRows[1]).toMatchObject({ from: 5, to: 5, limit: 1.14 });
    content.bands[0]!.orderRows[1]!.limit = 1.1;

    const res = await admin.request("PUT", `/api/limit-sets/${limitSet.key}`, { content, reason: "Utility agreement lowers order 5" });
    expect(res.status).toBe(200);
    const saved = await json<Detail>(res);
    expect(saved.limitSet.currentRevisionNumber).toBe(2);
    expect(saved.revision).toMatchObject({ number: 2, reason: "Utility agreement lowers order 5", authorName: expect.any(String) });
    expect(saved.revision.content.bands[0]!.orderRows[1]!.limit).toBe(1.1);

    const old = await json<Detail>(await engineer.request("GET", `/api/limit-sets/${limitSet.key}/revisions/1`));
    expect(old.revision.number).toBe(1);
    expect(old.revision.content).toEqual(revision.content);

    const history = await json<{ revisions: { number: number; current: boolean; changes: unknown[] }[] }>(
      await viewer.request("GET", `/api/limit-sets/${limitSet.key}/revisions`),
    );
    expect(history.revisions.map((r) => [r.number, r.current])).toEqual([[2, true], [1, false]]);
    expect(history.revisions[0]!.changes).toEqual([
      { kind: "changed", location: "Band 'Class A', row 2 (h 5)", field: "limit", before: "1.14", after: "1.1" },
    ]);

    const [set] = await db.select().from(limitSets).where(eq(limitSets.key, limitSet.key));
    const audit = await db.select().from(auditEvents).where(and(eq(auditEvents.entityId, set!.id), eq(auditEvents.action, "limit_set.revise")));
    expect(audit).toHaveLength(1);
    expect(audit[0]!.details).toMatchObject({ key: limitSet.key, number: 2, reason: "Utility agreement lowers order 5" });
  });

  it("refuses a revision without a reason (422) and saves nothing", async () => {
    const { limitSet, revision } = await cloneClassA("noreason");
    for (const body of [{ content: revision.content }, { content: revision.content, reason: "  " }]) {
      const res = await admin.request("PUT", `/api/limit-sets/${limitSet.key}`, body);
      expect(res.status).toBe(422);
      const { error } = await json<{ error: { fieldErrors: Record<string, string[]> } }>(res);
      expect(error.fieldErrors.reason?.[0]).toMatch(/reason/i);
    }
    const now = await json<Detail>(await admin.request("GET", `/api/limit-sets/${limitSet.key}`));
    expect(now.limitSet.currentRevisionNumber).toBe(1);
  });

  it("refuses an invalid formula (422), naming band, row and field", async () => {
    const { limitSet, revision } = await cloneClassA("badformula");
    const content = structuredClone(revision.content);
    // Row 7 is the odd 15–39 formula row.
    content.bands[0]!.orderRows[6]!.formula = "0.15*15/h)";
    const res = await admin.request("PUT", `/api/limit-sets/${limitSet.key}`, { content, reason: "typo" });
    expect(res.status).toBe(422);
    const { error } = await json<{ error: { fieldErrors: Record<string, string[]> } }>(res);
    expect(error.fieldErrors["content.bands.0.orderRows.6.formula"]).toEqual([`Band 'Class A', row 7: formula: unexpected ")" at position 10`]);
  });

  it("names the row for a non-number and for overlapping orders", async () => {
    const { limitSet, revision } = await cloneClassA("overlap");
    const messagesOf = async (content: unknown) => {
      const res = await admin.request("PUT", `/api/limit-sets/${limitSet.key}`, { content, reason: "test" });
      expect(res.status).toBe(422);
      return Object.values((await json<{ error: { fieldErrors: Record<string, string[]> } }>(res)).error.fieldErrors).flat();
    };
    const notNumber = structuredClone(revision.content) as unknown as { bands: { orderRows: Record<string, unknown>[] }[] };
    notNumber.bands[0]!.orderRows[0]!.limit = "lots";
    expect(await messagesOf(notNumber)).toEqual(["Band 'Class A', row 1: limit: must be a number"]);
    const overlap = structuredClone(revision.content);
    overlap.bands[0]!.orderRows.push({ from: 5, to: 5, parity: "all", limit: 1, basis: "A" });
    expect(await messagesOf(overlap)).toEqual(["Band 'Class A', row 12: order 5 is also covered by row 2"]);
  });

  it("keeps the set's key inside its content", async () => {
    const { limitSet, revision } = await cloneClassA("rekey");
    const res = await admin.request("PUT", `/api/limit-sets/${limitSet.key}`, { content: { ...revision.content, key: "other-key" }, reason: "rename" });
    expect(res.status).toBe(422);
    expect(Object.keys((await json<{ error: { fieldErrors: Record<string, string[]> } }>(res)).error.fieldErrors)).toContain("content.key");
  });

  it("refuses edits from non-admins (403) and anonymous callers (401)", async () => {
    const current = await json<Detail>(await admin.request("GET", `/api/limit-sets/${CLASS_A}`));
    const body = { content: current.revision.content, reason: "not allowed" };
    expect((await engineer.request("PUT", `/api/limit-sets/${CLASS_A}`, body)).status).toBe(403);
    expect((await viewer.request("PUT", `/api/limit-sets/${CLASS_A}`, body)).status).toBe(403);
    expect((await new Client().request("PUT", `/api/limit-sets/${CLASS_A}`, body)).status).toBe(401);
    expect((await engineer.request("POST", `/api/limit-sets/${CLASS_A}/clone`, { key: unique("eng"), name: "Nope" })).status).toBe(403);
    expect((await engineer.request("POST", "/api/limit-sets/import", { key: unique("eng"), name: "Nope", content: current.revision.content })).status).toBe(403);
    const after = await json<Detail>(await admin.request("GET", `/api/limit-sets/${CLASS_A}`));
    expect(after.limitSet.currentRevisionNumber).toBe(current.limitSet.currentRevisionNumber);
  });
});

describe("an evaluation keeps its revision", () => {
  it("an evaluation pinned to revision 1 still references revision 1 with its old content after an edit", async () => {
    const { limitSet, revision } = await cloneClassA("pinned");
    const [set] = await db.select().from(limitSets).where(eq(limitSets.key, limitSet.key));
    const rev1Id = set!.currentRevisionId!;
    const [site] = await db.insert(sites).values({ name: `Pin test ${limitSet.key}`, nominalVoltageV: 230, frequencyHz: 50 }).returning();
    const [capture] = await db
      .insert(captures)
      .values({ siteId: site!.id, title: "pinned capture", s3Key: `tests/${limitSet.key}.csv`, originalFilename: "pinned.csv", limitSetKey: limitSet.key })
      .returning();
    const [analysis] = await db.insert(analyses).values({ captureId: capture!.id, result: {} as never }).returning();
    const [evaluation] = await db
      .insert(evaluations)
      .values({ captureId: capture!.id, analysisId: analysis!.id, limitSetRevisionId: rev1Id, context: {}, result: {} as never, verdict: "pass" })
      .returning();

    const content = structuredClone(revision.content);
    content.bands[0]!.orderRows[0]!.limit = 2.0;
    const res = await admin.request("PUT", `/api/limit-sets/${limitSet.key}`, { content, reason: "Stricter order 3" });
    expect(res.status).toBe(200);

    const [pinned] = await db
      .select({ revisionId: evaluations.limitSetRevisionId, number: limitSetRevisions.number, content: limitSetRevisions.content })
      .from(evaluations)
      .innerJoin(limitSetRevisions, eq(limitSetRevisions.id, evaluations.limitSetRevisionId))
      .where(eq(evaluations.id, evaluation!.id));
    expect(pinned!.revisionId).toBe(rev1Id);
    expect(pinned!.number).toBe(1);
    expect((pinned!.content as LimitSetRevisionContent).bands[0]!.orderRows[0]!.limit).toBe(2.3);
    const [setAfter] = await db.select().from(limitSets).where(eq(limitSets.key, limitSet.key));
    expect(setAfter!.currentRevisionId).not.toBe(rev1Id);
  });
});

describe("clone, export and import", () => {
  it("clones into a custom set whose revision 1 copies the source with the new key", async () => {
    const source = await json<Detail>(await admin.request("GET", `/api/limit-sets/${CLASS_A}`));
    const clone = await cloneClassA("clone");
    expect(clone.limitSet).toMatchObject({ custom: true, currentRevisionNumber: 1, standard: "IEC 61000-3-2" });
    expect(clone.revision.reason).toBe(`Cloned from ${CLASS_A} revision ${source.revision.number}`);
    expect(clone.revision.content).toEqual({ ...source.revision.content, key: clone.limitSet.key });
    const again = await admin.request("POST", `/api/limit-sets/${CLASS_A}/clone`, { key: clone.limitSet.key, name: "Duplicate" });
    expect(again.status).toBe(409);
    const bad = await admin.request("POST", `/api/limit-sets/${CLASS_A}/clone`, { key: "Not A Key", name: "x" });
    expect(bad.status).toBe(422);
  });

  it("round-trips export → import as a new custom set, then as a new revision of an existing key", async () => {
    const source = await cloneClassA("export");
    const res = await viewer.request("GET", `/api/limit-sets/${source.limitSet.key}/export`);
    expect(res.status).toBe(200);
    expect(res.headers.get("content-disposition")).toBe(`attachment; filename="${source.limitSet.key}.json"`);
    const doc = await json<{ key: string; name: string; content: LimitSetRevisionContent }>(res);
    expect(doc).toEqual({ key: source.limitSet.key, name: source.limitSet.name, content: source.revision.content });

    // A new key makes a new custom set.
    const newKey = unique("imported");
    const created = await admin.request("POST", "/api/limit-sets/import", { key: newKey, name: "Imported utility limits", content: { ...doc.content, key: newKey } });
    expect(created.status).toBe(201);
    const imported = await json<Detail & { created: boolean }>(created);
    expect(imported).toMatchObject({ created: true, limitSet: { key: newKey, custom: true, currentRevisionNumber: 1 } });
    expect(imported.revision.content).toEqual({ ...doc.content, key: newKey });

    // The same key again: a reason is required, then it is the next revision.
    const changed = structuredClone(doc);
    changed.content.bands[0]!.orderRows[2]!.limit = 0.7;
    const noReason = await admin.request("POST", "/api/limit-sets/import", changed);
    expect(noReason.status).toBe(422);
    expect((await json<{ error: { fieldErrors: Record<string, string[]> } }>(noReason)).error.fieldErrors.reason).toEqual([`Limit set ${doc.key} exists: importing makes a new revision, so give a reason`]);
    const revised = await admin.request("POST", "/api/limit-sets/import", { ...changed, reason: "Re-imported after review" });
    expect(revised.status).toBe(200);
    const after = await json<Detail & { created: boolean }>(revised);
    expect(after).toMatchObject({ created: false, limitSet: { currentRevisionNumber: 2 }, revision: { number: 2, reason: "Re-imported after review" } });
    expect(after.revision.content.bands[0]!.orderRows[2]!.limit).toBe(0.7);

    const [set] = await db.select().from(limitSets).where(eq(limitSets.key, source.limitSet.key));
    const audit = await db.select().from(auditEvents).where(and(eq(auditEvents.entityId, set!.id), eq(auditEvents.action, "limit_set.import")));
    expect(audit).toHaveLength(1);
  });

  it("rejects an invalid import with the path of each problem", async () => {
    const source = await json<Detail>(await admin.request("GET", `/api/limit-sets/${CLASS_A}`));
    const key = unique("badimport");
    const content = structuredClone(source.revision.content) as unknown as Record<string, unknown> & { bands: { orderRows: Record<string, unknown>[] }[] };
    content.key = key;
    content.bands[0]!.orderRows[0]!.basis = "furlongs";
    const res = await admin.request("POST", "/api/limit-sets/import", { key, name: "Broken", content });
    expect(res.status).toBe(422);
    const { error } = await json<{ error: { fieldErrors: Record<string, string[]> } }>(res);
    expect(Object.keys(error.fieldErrors)).toEqual(["content.bands.0.orderRows.0.basis"]);
    expect(error.fieldErrors["content.bands.0.orderRows.0.basis"]![0]).toMatch(/^Band 'Class A', row 1: basis: /);
    const mismatch = await admin.request("POST", "/api/limit-sets/import", { key, name: "Mismatch", content: source.revision.content });
    expect(mismatch.status).toBe(422);
    expect((await admin.request("GET", `/api/limit-sets/${key}`)).status).toBe(404);
  });
});

describe("revisions below the application", () => {
  it("the database refuses to change a stored revision", async () => {
    const { sql } = await import("@/db/client");
    await expect(sql`update limit_set_revisions set reason = reason where number = 1`).rejects.toThrow(/immutable/);
  });
});

describe("limit formulas must give usable limits (422, never 500)", () => {
  type Errors = { error: { fieldErrors: Record<string, string[]> } };

  it("refuses 1/0, 0/0 and -1 on save, naming the order and the value, and saves nothing", async () => {
    const { limitSet, revision } = await cloneClassA("nonfinite");
    // Row 7 is the odd 15–39 formula row (IEC 61000-3-2:2018+A1:2020 Table 1: 0.15 × 15/n), first order 15.
    for (const [formula, value] of [["1/0", "Infinity"], ["0/0", "NaN"], ["-1", "-1"]] as const) {
      const content = structuredClone(revision.content);
      content.bands[0]!.orderRows[6]!.formula = formula;
      const res = await admin.request("PUT", `/api/limit-sets/${limitSet.key}`, { content, reason: "bad value" });
      expect(res.status).toBe(422);
      const { error } = await json<Errors>(res);
      expect(error.fieldErrors["content.bands.0.orderRows.6.formula"]).toEqual([
        `Band 'Class A', row 7: formula: order 15: formula "${formula}" gives ${value}; a limit must be a finite number ≥ 0`,
      ]);
    }
    const now = await json<Detail>(await admin.request("GET", `/api/limit-sets/${limitSet.key}`));
    expect(now.limitSet.currentRevisionNumber).toBe(1);
  });

  it("answers 422 for 10,000 nested parentheses and 100,000 unary minus (a stack overflow gave 500)", async () => {
    const { limitSet, revision } = await cloneClassA("nested");
    for (const formula of [`${"(".repeat(10_000)}1${")".repeat(10_000)}`, `${"-".repeat(100_000)}1`, `${"(".repeat(100)}1${")".repeat(100)}`]) {
      const content = structuredClone(revision.content);
      content.bands[0]!.orderRows[6]!.formula = formula;
      const res = await admin.request("PUT", `/api/limit-sets/${limitSet.key}`, { content, reason: "hostile formula" });
      expect(res.status).toBe(422);
      const message = (await json<Errors>(res)).error.fieldErrors["content.bands.0.orderRows.6.formula"]?.[0] ?? "";
      expect(message).toMatch(/longer than 2000 characters|nested more than 64 levels deep/);
      expect(message.length).toBeLessThan(400);
    }
  });

  it("import refuses a formula whose value is not finite with the same message", async () => {
    const { revision } = await cloneClassA("importnan");
    const key = unique("import-nan");
    const content = { ...structuredClone(revision.content), key };
    content.bands[0]!.orderRows[6]!.formula = "0/0";
    const res = await admin.request("POST", "/api/limit-sets/import", { key, name: "Broken import", content });
    expect(res.status).toBe(422);
    expect(Object.values((await json<Errors>(res)).error.fieldErrors).flat()).toContain(
      `Band 'Class A', row 7: formula: order 15: formula "0/0" gives NaN; a limit must be a finite number ≥ 0`,
    );
    expect((await admin.request("GET", `/api/limit-sets/${key}`)).status).toBe(404);
  });
});
