// Types of security-headers.mjs (plain JavaScript so that scripts/serve.mjs can load it).

/** The page policy for one response, naming its script nonce. */
export function contentSecurityPolicy(args: { nonce: string }): string;

/** API responses are data, never a document. */
export const apiContentSecurityPolicy: string;

/** Headers for every response; `api` adds the API policy (pages get theirs, with a nonce, from scripts/serve.mjs). */
export function securityHeaders(args: { api: boolean }): Record<string, string>;
