// What a JSON answer may not carry: the object storage key of an original, password and token hashes, session ids,
// the set-up's internals, and — to an outside reader — results that are not approved. Each check reads the
// answers a technician and a viewer actually get, as text, so a field under any name or nesting is caught.
import { beforeAll, describe, expect, it } from "vitest";
import { analysedCapture, currentCsv, json, uploadCapture } from "../support/captures";
import { signedIn, type Client } from "../support/http";

let tech: Client;
let engineer: Client;
let viewer: Client;
let siteId: string;
const stamp = Date.now();

/** Names and values that are internal wherever they appear in a JSON answer. */
function expectNoInternals(body: string, captureIds: string[] = []): void {
  expect(body).not.toMatch(/s3_?key|storage_?key|password_?hash|token_?hash|session_?id|interval_?mapping|setup_?by/i);
  // The bucket keys themselves: the original (captures/<id>/original) never leaves the server.
  for (const id of captureIds) expect(body).not.toContain(`captures/${id}/`);
}

async function text(res: Response): Promise<string> {
  expect(res.status).toBeLessThan(300);
  return res.text();
}

beforeAll(async () => {
  [tech, engineer, viewer] = await Promise.all([signedIn("technician"), signedIn("engineer"), signedIn("viewer")]);
  const { sites } = await json<{ sites: { id: string; name: string }[] }>(await tech.request("GET", "/api/sites"));
  // A site of the demo viewer's customer, so the viewer's side can be read too.
  siteId = sites.find((s) => s.name.startsWith("Quillbrook Cold Store"))!.id;
});

describe("no internal field reaches a client", () => {
  it("a technician's register, kind switch, set-up and reads of a capture carry no storage key (the PATCH used to answer the whole row)", async () => {
    const id = await uploadCapture(tech, { siteId, title: `Internal fields ${stamp}`, body: currentCsv(1) });
    await json(await tech.request("POST", `/api/captures/${id}/uploaded`));
    const answers = [
      await text(await tech.request("PATCH", `/api/captures/${id}`, { kind: "interval-log" })),
      await text(await tech.request("PATCH", `/api/captures/${id}`, { kind: "waveform" })),
      await text(await tech.request("PUT", `/api/captures/${id}/setup`, { mapping: { channels: {} }, limitSetKey: "iec-61000-3-2-class-a", context: {} })),
      await text(await tech.request("GET", `/api/captures/${id}`)),
      await text(await tech.request("GET", `/api/captures?page=1`)),
      await text(await tech.request("GET", `/api/sites`)),
      await text(await tech.request("GET", `/api/sites/${siteId}`)),
    ];
    for (const body of answers) expectNoInternals(body, [id]);
    // The slim shape of GET /api/captures/:id, the same for the PATCH and the set-up.
    const patched = JSON.parse(answers[1]!) as { capture: Record<string, unknown> };
    const read = JSON.parse(answers[3]!) as { capture: Record<string, unknown> };
    expect(Object.keys(patched.capture).sort()).toEqual(Object.keys(read.capture).sort());
    expect(patched.capture).not.toHaveProperty("mapping");
    expect(patched.capture).not.toHaveProperty("sha256");
  });

  it("registering a capture answers the upload policy for the incoming object only, never the original's key", async () => {
    const res = await tech.request("POST", "/api/captures", { siteId, title: `Register ${stamp}`, filename: "r.csv", sizeBytes: 10 });
    expect(res.status).toBe(201);
    const body = await res.text();
    const { capture } = JSON.parse(body) as { capture: { id: string } };
    expectNoInternals(body, [capture.id]);
  });

  it("a viewer's answers: no storage key, no evaluation or verdict newer than the approved one, no 'newer result awaits review'", async () => {
    const id = await analysedCapture(tech, siteId, `Viewer internals ${stamp}`, currentCsv(3));
    expect((await tech.request("POST", `/api/captures/${id}/review`, { action: "submitted" })).status).toBe(200);
    const { evaluations } = await json<{ evaluations: { id: string }[] }>(await engineer.request("GET", `/api/captures/${id}/evaluations`));
    expect((await engineer.request("POST", `/api/captures/${id}/review`, { action: "approved", evaluationId: evaluations[0]!.id })).status).toBe(200);
    // A newer result (Class B passes the 3 A third harmonic that fails Class A) awaits review beside the approved Fail.
    expect((await engineer.request("POST", `/api/captures/${id}/evaluations`, { limitSetKey: "iec-61000-3-2-class-b", context: {} })).status).toBe(201);

    const team = await json<{ evaluations: { id: string }[] }>(await engineer.request("GET", `/api/captures/${id}/evaluations`));
    expect(team.evaluations).toHaveLength(2);
    const seen = await json<{ evaluations: { id: string }[] }>(await viewer.request("GET", `/api/captures/${id}/evaluations`));
    expect(seen.evaluations.map((e) => e.id)).toEqual([evaluations[0]!.id]);

    type Item = { id: string; verdict: string; latestVerdict: string | null; newerAwaitsReview: boolean };
    const find = async (who: Client) => {
      for (let page = 1; page <= 50; page++) {
        const list = await json<{ items: Item[]; pages: number }>(await who.request("GET", `/api/captures?page=${page}`));
        const item = list.items.find((c) => c.id === id);
        if (item || page >= list.pages) return item;
      }
      return undefined;
    };
    expect(await find(engineer)).toMatchObject({ latestVerdict: "pass", newerAwaitsReview: true });
    expect(await find(viewer)).toMatchObject({ verdict: "fail", latestVerdict: "fail", newerAwaitsReview: false });

    for (const path of [`/api/captures/${id}`, `/api/captures/${id}/evaluations`, `/api/captures?page=1`, `/api/captures/${id}/studies`, "/api/sites", `/api/sites/${siteId}`]) {
      expectNoInternals(await text(await viewer.request("GET", path)), [id]);
    }
  });
});
