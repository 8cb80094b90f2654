// Capture set-up through the API, as a technician would do it in the browser.
import { expect } from "vitest";
import type { Client } from "./http";
import { pollFor } from "./poll";

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

/**
 * Registers a capture at a site and uploads `body` the browser's way (a form POST to the bucket with
 * the presigned policy); resolves to the capture's id. The upload is not yet confirmed.
 */
export async function uploadCapture(
  api: Client,
  { siteId, title, body, filename = "x.csv", kind, capturedAt }: { siteId: string; title: string; body: string | Uint8Array; filename?: string; kind?: "interval-log"; capturedAt?: string },
): Promise<string> {
  const sizeBytes = typeof body === "string" ? Buffer.byteLength(body) : body.length;
  const res = await api.request("POST", "/api/captures", { siteId, title, filename, sizeBytes, ...(kind ? { kind } : {}), ...(capturedAt ? { capturedAt } : {}) });
  expect(res.status).toBe(201);
  const { capture, upload } = (await res.json()) as { capture: { id: string }; upload: PresignedUpload };
  expect((await postUpload(upload, body)).ok).toBe(true);
  return capture.id;
}

/** Registers, uploads, confirms, maps and analyses a capture; resolves to its id once done. */
export async function analysedCapture(
  api: Client,
  siteId: string,
  title: string,
  csv: string,
  { filename = "x.csv", limitSetKey = "iec-61000-3-2-class-a", timeoutMs = 60_000 }: { filename?: string; limitSetKey?: string; timeoutMs?: number } = {},
): Promise<string> {
  const id = await uploadCapture(api, { siteId, title, body: csv, filename });
  await json(await api.request("POST", `/api/captures/${id}/uploaded`));
  await json(await api.request("PUT", `/api/captures/${id}/setup`, { mapping: { channels: {} }, limitSetKey, context: {} }));
  await json(await api.request("POST", `/api/captures/${id}/analyze`));
  await waitForCapture(api, id, timeoutMs);
  return id;
}

export interface FinishedCapture {
  status: "done" | "failed";
  failureReason: string | null;
}

/** Waits until a queued analysis has ended, done or failed; resolves to its status and failure reason. */
export async function finishedCapture(api: Client, id: string, timeoutMs = 60_000): Promise<FinishedCapture> {
  return pollFor(
    `capture ${id} to be analysed`,
    async () => {
      const { capture } = await json<{ capture: { status: string; failureReason: string | null } }>(await api.request("GET", `/api/captures/${id}`));
      return capture.status === "done" || capture.status === "failed" ? { status: capture.status, failureReason: capture.failureReason } : null;
    },
    { timeoutMs, intervalMs: 250 },
  );
}

/** Waits until a queued analysis is done; throws with the reason when it failed. */
export async function waitForCapture(api: Client, id: string, timeoutMs = 60_000): Promise<void> {
  const c = await finishedCapture(api, id, timeoutMs);
  if (c.status === "failed") throw new Error(`analysis failed: ${c.failureReason}`);
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
