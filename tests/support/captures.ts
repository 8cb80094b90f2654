// Capture set-up through the API, as a technician would do it in the browser.
import { expect } from "vitest";
import type { Client } from "./http";

export async function json<T>(res: Response): Promise<T> {
  if (!res.ok) throw new Error(`${res.status} ${await res.text()}`);
  return (await res.json()) as T;
}

export interface PresignedUpload {
  url: string;
  fields: Record<string, string>;
  expiresAt: string;
}

/** The browser's path: a form POST straight to the bucket with the presigned policy's fields, the file last. */
export async function postUpload(upload: PresignedUpload, body: string | Uint8Array, { contentType = "text/csv", fields = {} }: { contentType?: string; fields?: Record<string, string> } = {}): Promise<Response> {
  const form = new FormData();
  for (const [k, v] of Object.entries({ ...upload.fields, ...fields })) form.append(k, v);
  form.append("file", new Blob([typeof body === "string" ? body : new Uint8Array(body)], { type: contentType }), "upload.csv");
  return fetch(upload.url, { method: "POST", body: form });
}

/** Registers, uploads (presigned PUT), maps and analyses a capture; resolves to its id once done. */
export async function analysedCapture(
  api: Client,
  siteId: string,
  title: string,
  csv: string,
  { filename = "x.csv", limitSetKey = "iec-61000-3-2-class-a", timeoutMs = 60_000 }: { filename?: string; limitSetKey?: string; timeoutMs?: number } = {},
): Promise<string> {
  const { capture, upload } = await json<{ capture: { id: string }; upload: PresignedUpload }>(
    await api.request("POST", "/api/captures", { siteId, title, filename, sizeBytes: Buffer.byteLength(csv) }),
  );
  expect((await postUpload(upload, csv)).ok).toBe(true);
  await json(await api.request("POST", `/api/captures/${capture.id}/uploaded`));
  await json(await api.request("PUT", `/api/captures/${capture.id}/setup`, { mapping: { channels: {} }, limitSetKey, context: {} }));
  await json(await api.request("POST", `/api/captures/${capture.id}/analyze`));
  await waitForCapture(api, capture.id, timeoutMs);
  return capture.id;
}

/** Waits until a queued analysis is done; throws with the reason when it failed. */
export async function waitForCapture(api: Client, id: string, timeoutMs = 60_000): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const { capture: c } = await json<{ capture: { status: string; failureReason: string | null } }>(await api.request("GET", `/api/captures/${id}`));
    if (c.status === "done") return;
    if (c.status === "failed") throw new Error(`analysis failed: ${c.failureReason}`);
    if (Date.now() > deadline) throw new Error(`analysis did not finish in ${timeoutMs / 1000} s`);
    await new Promise((r) => setTimeout(r, 250));
  }
}

/** A demo capture as the captures list shows it, found by its title page by page (other tests add captures in front of it). */
export async function listedCapture<T extends { id: string; title: string }>(api: Client, title: string): Promise<T> {
  for (let page = 1; page <= 50; page++) {
    const { items, pages } = await json<{ items: T[]; pages: number }>(await api.request("GET", `/api/captures?status=done&page=${page}`));
    const found = items.find((c) => c.title === title);
    if (found) return found;
    if (page >= pages) break;
  }
  throw new Error(`no analysed capture titled "${title}"`);
}

/** The id of a demo capture by its title. */
export async function demoCaptureId(api: Client, title: string): Promise<string> {
  return (await listedCapture(api, title)).id;
}

/** A 20-cycle 50 Hz current record: 10 A fundamental plus `i3Rms` A of 3rd harmonic (analytic, 256 samples per cycle). */
export function currentCsv(i3Rms: number): string {
  const perCycle = 256;
  const f = 50;
  const lines = ["Time (s),I (A)"];
  for (let k = 0; k < 20 * perCycle; k += 1) {
    const t = k / (perCycle * f);
    const i = Math.SQRT2 * (10 * Math.sin(2 * Math.PI * f * t) + i3Rms * Math.sin(2 * Math.PI * 3 * f * t + 0.4));
    lines.push(`${t.toFixed(7)},${i.toFixed(4)}`);
  }
  return lines.join("\n") + "\n";
}
