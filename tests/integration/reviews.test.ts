// An approval covers exactly one result: the attacks of issue 10 §1 performed against the running app,
// PostgreSQL, s3rver and the mail catcher.
import { eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { analyses, captures, reviewEvents } from "@/db/schema";
import { analysedCapture, currentCsv, json, waitForCapture } from "../support/captures";
import { signedIn, waitForMail, type Client } from "../support/http";
import { pdfText } from "../unit/reports/pdf-text";

/**
 * The records judged here (currentCsv): 20 cycles of 50 Hz at 256 samples per cycle, I1 = 10 A r.m.s. plus a 3rd harmonic of `i3Rms`.
 * IEC 61000-3-2:2018+A1:2020 Table 1 (Class A): h3 limit 2.30 A, so 3 A fails. Clause 7.2: Class B limits
 * are the Table 1 values × 1.5, h3 3.45 A, so 3 A passes. With a current scale of 0.1 the h3 becomes
 * 0.3 A and passes Class A — the swap the issue reports.
 */

let tech: Client;
let engineer: Client;
let admin: Client;
let viewer: Client;
let siteId: string;
const stamp = Date.now();

interface SheetState {
  evaluations: { id: string; limitSetKey: string; verdict: string }[];
}

async function evaluationsOf(id: string): Promise<SheetState["evaluations"]> {
  return (await json<SheetState>(await engineer.request("GET", `/api/captures/${id}/evaluations`))).evaluations;
}

async function review(who: Client, id: string, body: Record<string, unknown>): Promise<Response> {
  return who.request("POST", `/api/captures/${id}/review`, body);
}

/** The PDF's text: what a customer or utility receives. */
async function pdfOf(who: Client, path: string): Promise<string> {
  const res = await who.request("GET", path);
  expect(res.status).toBe(200);
  return pdfText(Buffer.from(await res.arrayBuffer()));
}

async function shareLink(id: string): Promise<string> {
  const { url } = await json<{ url: string }>(await engineer.request("POST", `/api/captures/${id}/shares`, { label: "utility", expiresInDays: 7 }));
  return url.split("/share/")[1]!;
}

async function sharedPdf(token: string): Promise<string> {
  const res = await fetch(new URL(`/api/shared/${token}/report`, process.env.APP_URL));
  expect(res.status).toBe(200);
  return pdfText(Buffer.from(await res.arrayBuffer()));
}

/**
 * After a newer result: the capture is back in review, its approval still names the approved
 * evaluation, and the share link still shows that Fail, signed off. Resolves to the shared PDF's text.
 */
async function expectApprovedFailStands(id: string, approvedId: string, token: string): Promise<string> {
  const [row] = await db.select().from(captures).where(eq(captures.id, id));
  expect(row?.reviewState).toBe("in_review");
  expect(row?.approvedEvaluationId).toBe(approvedId);
  const shared = await sharedPdf(token);
  expect(shared).toContain("Overall verdict: FAIL");
  expect(shared).toMatch(/Sign-off\nApproved by Teodor Vance/);
  return shared;
}

async function failingCapture(title: string): Promise<string> {
  return analysedCapture(tech, siteId, `${title} ${stamp}`, currentCsv(3));
}

beforeAll(async () => {
  [tech, engineer, admin, viewer] = await Promise.all([signedIn("technician"), signedIn("engineer"), signedIn("admin"), signedIn("viewer")]);
  const { sites } = await json<{ sites: { id: string; name: string }[] }>(await tech.request("GET", "/api/sites"));
  // A site of the demo viewer's customer, so the viewer's side of each rule can be checked.
  siteId = sites.find((s) => s.name.startsWith("Quillbrook Cold Store"))!.id;
});

describe("review state machine", () => {
  it("refuses to approve a never-submitted capture, naming what is allowed (409)", async () => {
    const id = await failingCapture("Never submitted");
    const [latest] = await evaluationsOf(id);
    const res = await review(engineer, id, { action: "approved", evaluationId: latest!.id });
    expect(res.status).toBe(409);
    const body = (await res.json()) as { error: { message: string } };
    expect(body.error.message).toContain("Submitted for review");
    const [row] = await db.select().from(captures).where(eq(captures.id, id));
    expect(row?.reviewState).toBe("draft");
    expect(row?.approvedEvaluationId).toBeNull();
  });

  it("answers 409 to a second approval and to a technician 'submitting' an approved capture", async () => {
    const id = await failingCapture("Approve twice");
    expect((await review(tech, id, { action: "submitted" })).status).toBe(200);
    const [latest] = await evaluationsOf(id);
    expect((await review(engineer, id, { action: "approved", evaluationId: latest!.id, comment: "fail confirmed" })).status).toBe(200);
    const again = await review(engineer, id, { action: "approved", evaluationId: latest!.id });
    expect(again.status).toBe(409);
    const withdraw = await review(tech, id, { action: "submitted" });
    expect(withdraw.status).toBe(409);
    const [row] = await db.select().from(captures).where(eq(captures.id, id));
    expect(row?.reviewState).toBe("approved");
    expect(row?.approvedEvaluationId).toBe(latest!.id);
    // Only one approval event was recorded.
    const events = await db.select().from(reviewEvents).where(eq(reviewEvents.captureId, id));
    expect(events.filter((e) => e.action === "approved")).toHaveLength(1);
  });

  it("sends back and takes a resubmission; approving needs the newest evaluation's id", async () => {
    const id = await failingCapture("Send back");
    expect((await review(tech, id, { action: "submitted" })).status).toBe(200);
    expect((await review(engineer, id, { action: "sent_back", comment: "check the clamp" })).status).toBe(200);
    const [latest] = await evaluationsOf(id);
    // Sent back → approved is not a transition; the technician must resubmit first.
    expect((await review(engineer, id, { action: "approved", evaluationId: latest!.id })).status).toBe(409);
    expect((await review(tech, id, { action: "submitted" })).status).toBe(200);
    expect((await review(engineer, id, { action: "approved" })).status).toBe(422);
    expect((await review(engineer, id, { action: "approved", evaluationId: latest!.id })).status).toBe(200);
  });
});

describe("an approval covers exactly one result", () => {
  it("(a) a re-judgement after approval is a new, unapproved result; sheet, PDF, share link, viewers and list keep the approved one", async () => {
    const id = await failingCapture("Rejudged after approval");
    expect((await review(tech, id, { action: "submitted" })).status).toBe(200);
    const [approved] = await evaluationsOf(id);
    expect(approved!.verdict).toBe("fail");
    expect((await review(engineer, id, { action: "approved", evaluationId: approved!.id, comment: "fail confirmed" })).status).toBe(200);
    const token = await shareLink(id);

    // The attack: re-judge against Class B, where 3 A at h3 passes.
    const rejudged = await engineer.request("POST", `/api/captures/${id}/evaluations`, { limitSetKey: "iec-61000-3-2-class-b", context: {} });
    expect(rejudged.status).toBe(201);
    const { evaluationId: newer, verdict } = (await rejudged.json()) as { evaluationId: string; verdict: string };
    expect(verdict).toBe("pass");

    // What leaves the team still says Fail, approved — the approved evaluation.
    await expectApprovedFailStands(id, approved!.id, token);
    const pdf = await pdfOf(engineer, `/api/captures/${id}/report`);
    expect(pdf).toContain("Overall verdict: FAIL");
    // The newer result's PDF is not signed off.
    const newerPdf = await pdfOf(engineer, `/api/captures/${id}/report?evaluation=${newer}`);
    expect(newerPdf).toContain("Overall verdict: PASS");
    expect(newerPdf).toMatch(/Sign-off\nNot approved/);
    // Viewers: the approved verdict only, and no way to open the newer one.
    const list = await json<{ items: { id: string; verdict: string; newerAwaitsReview: boolean }[] }>(await viewer.request("GET", `/api/captures?site=${siteId}`));
    expect(list.items.find((c) => c.id === id)?.verdict).toBe("fail");
    expect((await viewer.request("GET", `/api/captures/${id}/report?evaluation=${newer}`)).status).toBe(404);
    expect((await viewer.request("GET", `/api/captures/${id}/sheet-body?evaluation=${newer}`)).status).toBe(404);
    // The team sees that a newer result waits.
    const teamList = await json<{ items: { id: string; verdict: string; newerAwaitsReview: boolean }[] }>(await engineer.request("GET", `/api/captures?site=${siteId}`));
    expect(teamList.items.find((c) => c.id === id)).toMatchObject({ verdict: "fail", newerAwaitsReview: true });
    const page = await (await engineer.request("GET", `/captures/${id}`)).text();
    expect(page).toContain("A newer result awaits review");

    // Four-eyes: the engineer who made the newer evaluation cannot approve it; an admin who did not can.
    const own = await review(engineer, id, { action: "approved", evaluationId: newer });
    expect(own.status).toBe(403);
    expect(JSON.stringify(await own.json())).toContain("four-eyes");
    // Approving the old evaluation again is refused: it is no longer the newest.
    expect((await review(admin, id, { action: "approved", evaluationId: approved!.id })).status).toBe(409);
    expect((await review(admin, id, { action: "approved", evaluationId: newer })).status).toBe(200);
    const sharedAfter = await sharedPdf(token);
    expect(sharedAfter).toContain("Overall verdict: PASS");
    expect(sharedAfter).toMatch(/Sign-off\nApproved by Ines Marlowe/);
  });

  it("(b) a technician cannot change the set-up of an approved capture or re-run it; an engineer's change starts a new review", async () => {
    const id = await failingCapture("Scale swap");
    expect((await review(tech, id, { action: "submitted" })).status).toBe(200);
    const scaled = { mapping: { channels: { "I (A)": { quantity: "current", scale: 0.1 } } }, limitSetKey: "iec-61000-3-2-class-a", context: {} };
    // Frozen while in review: the technician may no longer change it at all (403), and for an engineer
    // the set-up is frozen until the review sends it back (409).
    expect((await tech.request("PUT", `/api/captures/${id}/setup`, scaled)).status).toBe(403);
    expect((await tech.request("POST", `/api/captures/${id}/analyze`)).status).toBe(403);
    const inReview = await engineer.request("PUT", `/api/captures/${id}/setup`, scaled);
    expect(inReview.status).toBe(409);
    expect(JSON.stringify(await inReview.json())).toContain("frozen");
    expect((await engineer.request("POST", `/api/captures/${id}/analyze`)).status).toBe(409);
    const [approved] = await evaluationsOf(id);
    expect((await review(engineer, id, { action: "approved", evaluationId: approved!.id })).status).toBe(200);
    const token = await shareLink(id);

    // The attack: the technician opens the set-up of the approved capture, sets the scale to 0.1 and analyses.
    expect((await tech.request("PUT", `/api/captures/${id}/setup`, scaled)).status).toBe(403);
    expect((await tech.request("POST", `/api/captures/${id}/analyze`)).status).toBe(403);
    const [unchanged] = await db.select().from(captures).where(eq(captures.id, id));
    expect(unchanged?.mapping).toEqual({ channels: {} });

    // An engineer may, and the new result is a new review; the share link still shows the approved Fail.
    expect((await admin.request("PUT", `/api/captures/${id}/setup`, scaled)).status).toBe(200);
    expect((await admin.request("POST", `/api/captures/${id}/analyze`)).status).toBe(202);
    await waitForCapture(admin, id);
    const shared = await expectApprovedFailStands(id, approved!.id, token);
    // The set-up behind each result is on the sheet: scale × 1 for the approved one, × 0.1 for the new one.
    expect(shared).toMatch(/I \(A\): current, scale . 1\b/);
    expect(shared).toMatch(/File SHA-256/);
    const [newest] = await evaluationsOf(id);
    expect(newest!.verdict).toBe("pass");
    const newerPdf = await pdfOf(engineer, `/api/captures/${id}/report?evaluation=${newest!.id}`);
    expect(newerPdf).toMatch(/scale . 0\.1/);
    const [analysis] = await db.select().from(analyses).where(eq(analyses.captureId, id)).orderBy(analyses.createdAt);
    expect(analysis?.setup).toMatchObject({ limitSetKey: "iec-61000-3-2-class-a" });
    // The admin set it up and ran it: the admin cannot approve it (no bypass), the engineer can.
    expect((await review(admin, id, { action: "approved", evaluationId: newest!.id })).status).toBe(403);
    expect((await review(engineer, id, { action: "approved", evaluationId: newest!.id })).status).toBe(200);
  });

  it("keeps the share link on the approved result while a newer analysis has failed", async () => {
    const id = await failingCapture("Failed rerun");
    expect((await review(tech, id, { action: "submitted" })).status).toBe(200);
    const [approved] = await evaluationsOf(id);
    expect((await review(engineer, id, { action: "approved", evaluationId: approved!.id })).status).toBe(200);
    const token = await shareLink(id);
    // Leaving the only channel out makes the next run fail with a file/mapping problem.
    const broken = { mapping: { channels: { "I (A)": { ignore: true } } }, limitSetKey: "iec-61000-3-2-class-a", context: {} };
    expect((await admin.request("PUT", `/api/captures/${id}/setup`, broken)).status).toBe(200);
    expect((await admin.request("POST", `/api/captures/${id}/analyze`)).status).toBe(202);
    await expect(waitForCapture(admin, id)).rejects.toThrow(/analysis failed/);
    const shared = await sharedPdf(token);
    expect(shared).toContain("Overall verdict: FAIL");
    expect(shared).toMatch(/Sign-off\nApproved by Teodor Vance/);
    expect((await viewer.request("GET", `/api/captures/${id}/report`)).status).toBe(200);
  });

  it("tells engineers by e-mail when a capture is submitted, with a clickable absolute link", async () => {
    const id = await failingCapture("Mail on submit");
    expect((await review(tech, id, { action: "submitted", comment: "please look" })).status).toBe(200);
    const mail = await waitForMail("engineer@ordwise.test", { match: (m) => m.subject.includes(`Mail on submit ${stamp}`) });
    expect(mail.subject).toContain("submitted for review");
    const link = new URL(`/captures/${id}`, process.env.APP_URL).toString();
    expect(mail.text).toContain(link);
    expect(mail.html).toContain(`<a href="${link}">`);
  });
});
