// Front-end diagnosis and mitigation studies through the API, on the demo compressor-drive capture.
import { beforeAll, describe, expect, it } from "vitest";
import { demoCaptureId, json } from "../support/captures";
import { Client, signedIn } from "../support/http";

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
