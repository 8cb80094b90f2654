import "server-only";
import type { NextRequest } from "next/server";

/** Whether an If-None-Match header lists `etag` (or is `*`); weak and strong forms compare equal, as for GET. */
function matches(ifNoneMatch: string | null, etag: string): boolean {
  if (!ifNoneMatch) return false;
  return ifNoneMatch.split(",").some((tag) => {
    const t = tag.trim();
    return t === "*" || t === etag || t === `W/${etag}`;
  });
}

/**
 * A chart-data answer: the JSON text as loaded (not parsed and serialised again), with the evaluation's id
 * as its ETag — the data of one evaluation never changes — and 304 when the client already holds it.
 */
export function chartsResponse(req: NextRequest, charts: { evaluationId: string | null; json: string }, cacheControl: string): Response {
  const headers: Record<string, string> = { "cache-control": cacheControl, vary: "cookie" };
  if (charts.evaluationId) headers.etag = `"${charts.evaluationId}"`;
  if (headers.etag && matches(req.headers.get("if-none-match"), headers.etag)) return new Response(null, { status: 304, headers });
  return new Response(charts.json, { status: 200, headers: { ...headers, "content-type": "application/json" } });
}
