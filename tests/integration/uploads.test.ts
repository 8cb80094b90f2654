// The original file cannot be swapped or oversized: the attacks of issue 10 §2 performed against the
// running app and s3rver. s3rver 3.7.1 does not check POST policies (its form handler skips the
// "policy" field), so these attacks reach the bucket and the server-side checks must stop them.
import crypto from "node:crypto";
import { readFileSync } from "node:fs";
import { eq } from "drizzle-orm";
import PgBoss from "pg-boss";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { analyses, auditEvents, captures } from "@/db/schema";
import { cleanupQueue } from "@/lib/jobs/queue";
import { getObjectBytes, headObject, putObject } from "@/lib/storage/s3";
import { analysedCapture, json, postUpload, waitForCapture, type PresignedUpload } from "../support/captures";
import { signedIn, type Client } from "../support/http";

let tech: Client;
let siteId: string;
const good = readFileSync("fixtures/single-phase-50hz.csv");
const sha256 = (b: Uint8Array | string) => crypto.createHash("sha256").update(b).digest("hex");

beforeAll(async () => {
  tech = await signedIn("technician");
  const { sites } = await json<{ sites: { id: string; name: string }[] }>(await tech.request("GET", "/api/sites"));
  siteId = (sites.find((s) => s.name.startsWith("Bench B")) ?? sites[0]!).id;
});

/** Registers a capture; the original's storage key is read from the database (no answer carries it). */
async function register(sizeBytes: number, title = "Upload attack"): Promise<{ id: string; s3Key: string; upload: PresignedUpload }> {
  const { capture, upload } = await json<{ capture: { id: string }; upload: PresignedUpload }>(
    await tech.request("POST", "/api/captures", { siteId, title: `${title} ${Date.now()}`, filename: "record.csv", sizeBytes }),
  );
  const [row] = await db.select({ s3Key: captures.s3Key }).from(captures).where(eq(captures.id, capture.id));
  return { id: capture.id, s3Key: row!.s3Key, upload };
}

async function confirm(id: string): Promise<{ status: number; message: string }> {
  const res = await tech.request("POST", `/api/captures/${id}/uploaded`);
  const body = (await res.json()) as { error?: { message: string } };
  return { status: res.status, message: body.error?.message ?? "" };
}

async function rowOf(id: string) {
  const [row] = await db.select().from(captures).where(eq(captures.id, id));
  return row!;
}

describe("the upload policy", () => {
  it("never hands out a URL for the original's key, and expires within 10 minutes", async () => {
    const { s3Key, upload } = await register(good.length);
    expect(upload.fields.key).not.toBe(s3Key);
    expect(upload.fields["Content-Type"]).toBe("text/csv");
    expect(Date.parse(upload.expiresAt) - Date.now()).toBeLessThanOrEqual(600_000);
    const policy = JSON.parse(Buffer.from(upload.fields.Policy!, "base64").toString("utf8")) as { conditions: unknown[] };
    expect(policy.conditions).toContainEqual(["content-length-range", 1, good.length]);
  });
});

describe("attacks on the original", () => {
  it("refuses an oversized file: 10 bytes registered, 2.7 MB sent", async () => {
    const { id, s3Key, upload } = await register(10);
    const big = Buffer.alloc(2_700_000, "1,2\n");
    await postUpload(upload, big); // s3rver stores it; a real S3 bucket refuses it by the policy
    const res = await confirm(id);
    expect(res.status).toBe(422);
    expect(res.message).toContain("2700000 bytes");
    expect(res.message).toContain("10 bytes were registered");
    expect((await rowOf(id)).status).toBe("uploading");
    expect(await headObject(s3Key)).toBeNull();
  });

  it("refuses an executable sent as application/x-msdownload, and one sent as text/csv", async () => {
    const exe = Buffer.concat([Buffer.from("MZ\x90\x00\x03\x00\x00\x00", "latin1"), crypto.randomBytes(4000)]);
    const first = await register(exe.length);
    await postUpload(first.upload, exe, { contentType: "application/x-msdownload", fields: { "Content-Type": "application/x-msdownload" } });
    const typed = await confirm(first.id);
    expect(typed.status).toBe(422);
    expect(typed.message).toContain("application/x-msdownload");

    const second = await register(exe.length);
    await postUpload(second.upload, exe);
    const sniffed = await confirm(second.id);
    expect(sniffed.status).toBe(422);
    expect(sniffed.message).toContain("Windows executable");
    expect((await rowOf(second.id)).status).toBe("uploading");
  });

  it("refuses PNG, ZIP and PDF files named .csv at confirmation with a message", async () => {
    const files: [string, Buffer][] = [
      ["PNG image", Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), crypto.randomBytes(500)])],
      ["ZIP archive", Buffer.concat([Buffer.from("PK\x03\x04", "latin1"), crypto.randomBytes(500)])],
      ["PDF document", Buffer.from("%PDF-1.7\n1 0 obj\n<< /Type /Catalog >>\nendobj\n")],
    ];
    for (const [kind, bytes] of files) {
      const { id, upload } = await register(bytes.length);
      await postUpload(upload, bytes);
      const res = await confirm(id);
      expect(res.status).toBe(422);
      expect(res.message).toContain(kind);
    }
  });

  it("records size and SHA-256 at confirmation; a second upload after confirmation does not replace the original", async () => {
    const { id, s3Key, upload } = await register(good.length, "Second upload");
    expect((await postUpload(upload, good)).ok).toBe(true);
    const confirmed = await tech.request("POST", `/api/captures/${id}/uploaded`);
    expect(confirmed.status).toBe(200);
    expect(await rowOf(id)).toMatchObject({ status: "uploaded", sizeBytes: good.length, sha256: sha256(good) });

    // The attack: the same policy again, with another file of the same size.
    const swapped = Buffer.from(good.toString("latin1").replace(/\d/g, "9"), "latin1");
    expect(swapped.length).toBe(good.length);
    await postUpload(upload, swapped);
    expect((await confirm(id)).status).toBe(409);
    expect(Buffer.from(await getObjectBytes(s3Key)).equals(good)).toBe(true);

    expect((await tech.request("PUT", `/api/captures/${id}/setup`, { mapping: { channels: {} }, limitSetKey: "iec-61000-3-2-class-a", context: {} })).status).toBe(200);
    expect((await tech.request("POST", `/api/captures/${id}/analyze`)).status).toBe(202);
    await waitForCapture(tech, id);
    const [analysis] = await db.select().from(analyses).where(eq(analyses.captureId, id));
    expect(analysis?.fileSha256).toBe(sha256(good));
  });

  it("fails the analysis clearly when the stored original changed after confirmation", async () => {
    const { id, s3Key, upload } = await register(good.length, "Changed in storage");
    await postUpload(upload, good);
    expect((await tech.request("POST", `/api/captures/${id}/uploaded`)).status).toBe(200);
    expect((await tech.request("PUT", `/api/captures/${id}/setup`, { mapping: { channels: {} }, limitSetKey: "iec-61000-3-2-class-a", context: {} })).status).toBe(200);
    // Someone with write access to the bucket replaces the original behind the app's back.
    const changed = good.toString("latin1").replace("1", "2");
    expect(changed).not.toBe(good.toString("latin1"));
    await putObject(s3Key, changed, "text/csv");
    expect((await tech.request("POST", `/api/captures/${id}/analyze`)).status).toBe(202);
    await expect(waitForCapture(tech, id)).rejects.toThrow(/SHA-256/);
    const row = await rowOf(id);
    expect(row.status).toBe("failed");
    expect(row.failureReason).toContain("no longer matches the file confirmed at upload");
    expect(await db.select().from(analyses).where(eq(analyses.captureId, id))).toHaveLength(0);
  });
});

describe("uploads that never complete, withdrawal and kind switch", () => {
  it("a scheduled job removes a capture whose upload never completed after 24 h (object and row), and keeps younger ones", async () => {
    const old = await register(good.length, "Abandoned upload");
    await postUpload(old.upload, good);
    const young = await register(good.length, "Upload in progress");
    // Registered 25 hours ago and never confirmed.
    await db.update(captures).set({ createdAt: new Date(Date.now() - 25 * 3_600_000) }).where(eq(captures.id, old.id));
    const boss = new PgBoss({ connectionString: process.env.DATABASE_URL!, schema: "pgboss", supervise: false, schedule: false });
    await boss.start();
    try {
      // The schedule is registered on the queue by the worker…
      const schedules = await boss.getSchedules();
      expect(schedules.map((s) => s.name)).toContain(cleanupQueue);
      // …and a run (here started at once rather than waiting for the hour) removes the abandoned capture.
      await boss.send(cleanupQueue, {});
      const deadline = Date.now() + 30_000;
      while (Date.now() < deadline && (await db.select({ id: captures.id }).from(captures).where(eq(captures.id, old.id))).length > 0) {
        await new Promise((r) => setTimeout(r, 250));
      }
    } finally {
      await boss.stop({ graceful: false });
    }
    expect(await db.select().from(captures).where(eq(captures.id, old.id))).toHaveLength(0);
    expect(await headObject(`uploads/${old.id}/incoming`)).toBeNull();
    expect(await db.select().from(captures).where(eq(captures.id, young.id))).toHaveLength(1);
    const audit = await db.select().from(auditEvents).where(eq(auditEvents.entityId, old.id));
    expect(audit.map((a) => a.action)).toContain("capture.upload_abandoned_removed");
  });

  it("lets the uploader withdraw a capture before submission: hidden from lists, kept in the audit log; not after submission", async () => {
    const { id, upload } = await register(good.length, "Withdrawn");
    await postUpload(upload, good);
    expect((await tech.request("POST", `/api/captures/${id}/uploaded`)).status).toBe(200);
    const engineer = await signedIn("engineer");
    expect((await engineer.request("DELETE", `/api/captures/${id}`)).status).toBe(403);
    expect((await tech.request("DELETE", `/api/captures/${id}`)).status).toBe(200);
    expect((await tech.request("GET", `/api/captures/${id}`)).status).toBe(404);
    const list = await json<{ items: { id: string }[] }>(await tech.request("GET", `/api/captures?site=${siteId}`));
    expect(list.items.map((c) => c.id)).not.toContain(id);
    expect((await rowOf(id)).withdrawnAt).not.toBeNull();
    const audit = await db.select().from(auditEvents).where(eq(auditEvents.entityId, id));
    expect(audit.map((a) => a.action)).toContain("capture.withdraw");

    const submitted = await analysedCapture(tech, siteId, `Submitted, not withdrawable ${Date.now()}`, good.toString("utf8"));
    expect((await tech.request("POST", `/api/captures/${submitted}/review`, { action: "submitted" })).status).toBe(200);
    expect((await tech.request("DELETE", `/api/captures/${submitted}`)).status).toBe(409);
  });

  it("switches the upload kind before analysis, not after", async () => {
    const { id, upload } = await register(good.length, "Kind switch");
    await postUpload(upload, good);
    expect((await tech.request("POST", `/api/captures/${id}/uploaded`)).status).toBe(200);
    const switched = await tech.request("PATCH", `/api/captures/${id}`, { kind: "interval-log" });
    expect(switched.status).toBe(200);
    expect((await rowOf(id)).kind).toBe("interval-log");
    expect((await tech.request("PATCH", `/api/captures/${id}`, { kind: "waveform" })).status).toBe(200);
    expect((await tech.request("PUT", `/api/captures/${id}/setup`, { mapping: { channels: {} }, limitSetKey: "iec-61000-3-2-class-a", context: {} })).status).toBe(200);
    expect((await tech.request("POST", `/api/captures/${id}/analyze`)).status).toBe(202);
    await waitForCapture(tech, id);
    const late = await tech.request("PATCH", `/api/captures/${id}`, { kind: "interval-log" });
    expect(late.status).toBe(409);
    expect((await rowOf(id)).kind).toBe("waveform");
  });
});
