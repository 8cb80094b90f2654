import "server-only";
import { gunzipSync } from "node:zlib";
import type { NextRequest } from "next/server";

/** Whether an If-None-Match header lists `etag` (or is `*`); weak and strong forms compare equal, as for GET. */
function matches(ifNoneMatch: string | null, etag: string): boolean {
  if (!ifNoneMatch) return false;
  return ifNoneMatch.split(",").some((tag) => {
    const t = tag.trim();
    return t === "*" || t === etag || t === `W/${etag}`;
  });
}

/** Whether an Accept-Encoding header accepts gzip (named, or `*`, with a non-zero weight). */
function acceptsGzip(acceptEncoding: string | null): boolean {
  const q = new Map<string, number>();
  for (const part of (acceptEncoding ?? "").toLowerCase().split(",")) {
    const [coding, ...params] = part.split(";").map((p) => p.trim());
    if (!coding) continue;
    const weight = params.find((p) => p.startsWith("q="));
    q.set(coding, weight ? Number(weight.slice(2)) : 1);
  }
  const gzip = q.get("gzip") ?? q.get("x-gzip") ?? q.get("*");
  return gzip !== undefined && gzip > 0;
}

/**
 * A JSON answer stored gzipped (chart data, sheet bodies) sent as it is (`Content-Encoding: gzip`) to a
 * client that accepts gzip — every browser — and unzipped for one that does not. Its strong ETag is `tag`
 * (what the stored bytes are of: an evaluation's id, which never changes), with `-gzip` for the gzipped
 * form (two encodings are two representations); a client that already holds it gets 304. Called only
 * once the reader has been allowed the capture: the tag is no key.
 */
export function gzipResponse(req: NextRequest, stored: { tag: string | null; gzip: Buffer }, cacheControl: string): Response {
  const gzip = acceptsGzip(req.headers.get("accept-encoding"));
  const headers: Record<string, string> = { "cache-control": cacheControl, vary: "cookie, accept-encoding" };
  if (stored.tag) headers.etag = `"${stored.tag}${gzip ? "-gzip" : ""}"`;
  if (headers.etag && matches(req.headers.get("if-none-match"), headers.etag)) return new Response(null, { status: 304, headers });
  headers["content-type"] = "application/json";
  if (!gzip) return new Response(new Uint8Array(gunzipSync(stored.gzip)), { status: 200, headers });
  // Next.js would drop a Content-Encoding header; scripts/serve.mjs sends this one as it.
  return new Response(new Uint8Array(stored.gzip), { status: 200, headers: { ...headers, "x-content-encoding": "gzip" } });
}
