// The response headers every page and route carries (issue 10 §5). Used by next.config.ts (static headers)
// and scripts/serve.mjs (the per-request page policy with its nonce, the API 405). Plain JavaScript with no
// imports, so the web server loads it without a build step; its types are in security-headers.d.mts.

/** Origin of the object store the browser uploads to directly (presigned requests), or null. */
function storageOrigin() {
  try {
    return new URL(process.env.S3_PUBLIC_ENDPOINT ?? process.env.S3_ENDPOINT ?? "http://127.0.0.1:4569").origin;
  } catch {
    return null;
  }
}

/**
 * The page policy: scripts only from this app and only with this request's nonce ('strict-dynamic' lets
 * them load the app's chunks), styles from the app plus inline style attributes (React and the charts set
 * them), no plugins, no framing, forms and fetches only to the app and its object store.
 * @param {{ nonce: string }} args
 * @returns {string}
 */
export function contentSecurityPolicy({ nonce }) {
  const storage = storageOrigin();
  const dev = process.env.NODE_ENV === "development";
  return [
    "default-src 'self'",
    `script-src 'self' 'nonce-${nonce}' 'strict-dynamic'${dev ? " 'unsafe-eval'" : ""}`,
    "style-src 'self' 'unsafe-inline'",
    "img-src 'self' blob: data:",
    "font-src 'self'",
    `connect-src 'self'${storage ? ` ${storage}` : ""}`,
    "object-src 'none'",
    "base-uri 'self'",
    `form-action 'self'${storage ? ` ${storage}` : ""}`,
    "frame-ancestors 'none'",
  ].join("; ");
}

/** API responses are data, never a document: nothing may load from them and nobody may frame them. */
export const apiContentSecurityPolicy = "default-src 'none'; frame-ancestors 'none'; base-uri 'none'";

/**
 * Headers for every response; `api` adds the API policy (pages get theirs, with a nonce, from scripts/serve.mjs).
 * @param {{ api: boolean }} args
 * @returns {Record<string, string>}
 */
export function securityHeaders({ api }) {
  return {
    "x-content-type-options": "nosniff",
    "referrer-policy": "same-origin",
    "x-frame-options": "DENY",
    ...(api ? { "content-security-policy": apiContentSecurityPolicy } : {}),
  };
}
