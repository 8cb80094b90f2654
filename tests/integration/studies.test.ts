// Front-end diagnosis and mitigation studies through the API, on the demo compressor-drive capture.
import { beforeAll, describe, expect, it } from "vitest";
import { analysedCapture, currentCsv, demoCaptureId, json } from "../support/captures";
import { Client, signedIn } from "../support/http";
import { pdfText } from "../unit/reports/pdf-text";

let engineer: Client;
let tech: Client;
let captureId: string;

beforeAll(async () => {
  engineer = await signedIn("engineer");
  tech = await signedIn("technician");
  captureId = await demoCaptureId(engineer, "Compressor drives at full load — before filter");
});

describe("diagnosis and mitigation studies", () => {
  it("diagnoses each current channel with at most three candidates, best first", async () => {
    const res = await tech.request("GET", `/api/captures/${captureId}/diagnosis`);
    expect(res.status).toBe(200);
    const { diagnosis } = (await res.json()) as { diagnosis: { modelVersion: string; channels: { name: string; candidates: { family: string; fitErrorPercent: number }[]; summary: string }[] } };
    // The record's current channels (fixtures/demo/quillbrook-drives-before-filter.csv).
    expect(diagnosis.channels.map((c) => c.name)).toEqual(["Ia (A)", "Ib (A)", "Ic (A)"]);
    for (const ch of diagnosis.channels) {
      expect(ch.candidates.length).toBeLessThanOrEqual(3);
      expect(ch.candidates.length).toBeGreaterThan(0);
      expect(ch.candidates[0]!.fitErrorPercent).toBeLessThanOrEqual(ch.candidates.at(-1)!.fitErrorPercent);
      expect(ch.summary.length).toBeGreaterThan(10);
    }
  });

  it("a preview is judged against the revision and context of the capture's evaluation, and saves nothing", async () => {
    const saved = async () => ({
      evaluations: await json(await tech.request("GET", `/api/captures/${captureId}/evaluations`)),
      studies: ((await json(await tech.request("GET", `/api/captures/${captureId}/studies`))) as { studies: unknown[] }).studies,
    });
    const before = await saved();
    const res = await tech.request("POST", `/api/captures/${captureId}/studies/preview`, { mitigations: [{ kind: "reactor", percent: 5 }] });
    expect(res.status).toBe(200);
    const { result } = (await res.json()) as { result: { prediction: boolean; compliance: { limitSet: { key: string }; context: { iscA: number; ilA: number } } | null; caution: string } };
    expect(result.prediction).toBe(true);
    expect(result.compliance!.limitSet.key).toBe("ieee-519-2014-current");
    expect(result.compliance!.context).toMatchObject({ iscA: 8200, ilA: 260 });
    expect(result.caution).toMatch(/model prediction/);
    expect(await saved()).toEqual(before);
  });

  it("bad mitigation input gets 422 naming the field", async () => {
    const res = await tech.request("POST", `/api/captures/${captureId}/studies/preview`, { mitigations: [{ kind: "passive-filter", tuningOrder: 4.7 }] });
    expect(res.status).toBe(422);
    const body = (await res.json()) as { error: { fieldErrors?: Record<string, string[]> } };
    expect(Object.keys(body.error.fieldErrors ?? {}).join(" ")).toMatch(/kvar/);
  });

  it("only engineers save; the saved study is recomputed on the server and listed with its inputs and model version", async () => {
    const inputs = { mitigations: [{ kind: "active-filter", ratingA: 40 }] };
    const denied = await tech.request("POST", `/api/captures/${captureId}/studies`, { title: "tech try", inputs });
    expect(denied.status).toBe(403);
    const title = `Active filter 40 A ${Date.now()}`;
    // A result sent by the client is not a field of the request: it is dropped, never stored.
    const saved = await engineer.request("POST", `/api/captures/${captureId}/studies`, { title, includeInReport: false, inputs, result: { compliance: { verdict: "pass" } } });
    expect(saved.status).toBe(201);
    const { studyId } = (await saved.json()) as { studyId: string };
    const list = (await (await tech.request("GET", `/api/captures/${captureId}/studies`)).json()) as {
      studies: { id: string; title: string; modelVersion: string; inputs: { mitigations: { kind: string; ratingA: number; fromOrder: number; toOrder: number }[] }; result: { channels: { filters: { ratingUsedA: number }[] }[] } }[];
    };
    const study = list.studies.find((s) => s.id === studyId)!;
    expect(study.title).toBe(title);
    expect(study.modelVersion).toBe("frontends-1");
    expect(study.inputs.mitigations[0]).toEqual({ kind: "active-filter", ratingA: 40, fromOrder: 2, toOrder: 50 });
    expect(study.result.channels[0]!.filters[0]!.ratingUsedA).toBeLessThanOrEqual(40 + 1e-9);
  });

  it("the demo studies: the 5 % reactor is predicted to fail and the 4.7th filter to pass", async () => {
    const list = (await (await engineer.request("GET", `/api/captures/${captureId}/studies`)).json()) as { studies: { title: string; predictedVerdict: string; includeInReport: boolean }[] };
    const reactor = list.studies.find((s) => s.title === "5 % line reactor on each drive")!;
    const filter = list.studies.find((s) => s.title === "4.7th filter, 3 Mvar at the 11 kV PCC")!;
    expect(reactor.predictedVerdict).toBe("fail");
    expect(filter.predictedVerdict).toBe("pass");
    expect(filter.includeInReport).toBe(true);
  });
});

// A study starts from one evaluation and says which. Outside the team (viewers, share links) only the studies of the
// approved evaluation exist; viewers run no new what-ifs. On the old code a viewer listed (and got in the PDF) a
// study of a newer, unapproved evaluation, could run previews, and every study started from the newest evaluation.
describe("studies follow the evaluation they start from", () => {
  it("a viewer sees only studies of the approved evaluation and runs none; the team names the evaluation", async () => {
    const viewer = await signedIn("viewer");
    const admin = await signedIn("admin");
    const { sites } = await json<{ sites: { id: string; name: string }[] }>(await tech.request("GET", "/api/sites"));
    // A site of the demo viewer's customer. The record (tests/support currentCsv): I1 = 10 A, h3 = 3 A.
    const siteId = sites.find((s) => s.name.startsWith("Quillbrook Cold Store"))!.id;
    const id = await analysedCapture(tech, siteId, `Study starting points ${Date.now()}`, currentCsv(3));
    expect((await tech.request("POST", `/api/captures/${id}/review`, { action: "submitted" })).status).toBe(200);
    const [approved] = (await json<{ evaluations: { id: string }[] }>(await engineer.request("GET", `/api/captures/${id}/evaluations`))).evaluations;
    expect((await engineer.request("POST", `/api/captures/${id}/review`, { action: "approved", evaluationId: approved!.id })).status).toBe(200);
    const inputs = { mitigations: [{ kind: "active-filter", ratingA: 5 }] };
    // Saved without naming an evaluation: it starts from the sheet's default, the approved one.
    const fromApproved = await json<{ studyId: string; evaluationId: string }>(await engineer.request("POST", `/api/captures/${id}/studies`, { title: "From the approved result", includeInReport: true, inputs }));
    expect(fromApproved.evaluationId).toBe(approved!.id);

    // A newer evaluation (Class B, not approved) and a study started from it.
    const newer = await json<{ evaluationId: string }>(await admin.request("POST", `/api/captures/${id}/evaluations`, { limitSetKey: "iec-61000-3-2-class-b", context: {} }));
    const fromNewer = await json<{ studyId: string; evaluationId: string }>(
      await engineer.request("POST", `/api/captures/${id}/studies`, { title: "From the unapproved result", includeInReport: true, inputs, evaluationId: newer.evaluationId }),
    );
    expect(fromNewer.evaluationId).toBe(newer.evaluationId);

    // The team chooses the starting point: each preview is judged against its evaluation's limit set.
    const previewOf = async (evaluationId: string) =>
      (await json<{ evaluationId: string; result: { compliance: { limitSet: { key: string } } } }>(await engineer.request("POST", `/api/captures/${id}/studies/preview`, { ...inputs, evaluationId })));
    expect((await previewOf(approved!.id)).result.compliance.limitSet.key).toBe("iec-61000-3-2-class-a");
    expect((await previewOf(newer.evaluationId)).result.compliance.limitSet.key).toBe("iec-61000-3-2-class-b");
    const team = await json<{ studies: { id: string; evaluationId: string }[] }>(await engineer.request("GET", `/api/captures/${id}/studies`));
    expect(Object.fromEntries(team.studies.map((s) => [s.id, s.evaluationId]))).toEqual({ [fromApproved.studyId]: approved!.id, [fromNewer.studyId]: newer.evaluationId });

    // The viewer: the approved evaluation's study only, in the list and in the PDF; no what-ifs (403).
    const seen = await json<{ studies: { id: string }[]; canTryFix: boolean; canSave: boolean }>(await viewer.request("GET", `/api/captures/${id}/studies`));
    expect(seen.studies.map((s) => s.id)).toEqual([fromApproved.studyId]);
    expect(seen).toMatchObject({ canTryFix: false, canSave: false });
    expect((await viewer.request("POST", `/api/captures/${id}/studies/preview`, inputs)).status).toBe(403);
    expect((await viewer.request("POST", `/api/captures/${id}/studies/preview`, { ...inputs, evaluationId: newer.evaluationId })).status).toBe(403);
    // The diagnosis a viewer reads is of the approved result; naming the newer evaluation is "not found".
    expect((await viewer.request("GET", `/api/captures/${id}/diagnosis`)).status).toBe(200);
    expect((await viewer.request("GET", `/api/captures/${id}/diagnosis?evaluation=${newer.evaluationId}`)).status).toBe(404);
    const pdfOf = async (res: Response) => {
      expect(res.status).toBe(200);
      return pdfText(Buffer.from(await res.arrayBuffer()));
    };
    const viewerPdf = await pdfOf(await viewer.request("GET", `/api/captures/${id}/report`));
    expect(viewerPdf).toContain("From the approved result");
    expect(viewerPdf).not.toContain("From the unapproved result");
    // A share link shows the approved evaluation and only its studies.
    const { url } = await json<{ url: string }>(await engineer.request("POST", `/api/captures/${id}/shares`, { label: "utility", expiresInDays: 7 }));
    const sharedPdf = await pdfOf(await fetch(new URL(`/api/shared/${url.split("/share/")[1]}/report`, process.env.APP_URL)));
    expect(sharedPdf).toContain("From the approved result");
    expect(sharedPdf).not.toContain("From the unapproved result");
    // The team's PDF of the newer evaluation carries the study started from it, not the approved one's.
    const newerPdf = await pdfOf(await engineer.request("GET", `/api/captures/${id}/report?evaluation=${newer.evaluationId}`));
    expect(newerPdf).toContain("From the unapproved result");
    expect(newerPdf).not.toContain("From the approved result");
  });
});
