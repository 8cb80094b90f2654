import "server-only";
import { NextResponse, type NextRequest } from "next/server";
import type { User } from "lucia";
import { AppError, toErrorResponse } from "@/lib/errors";
import { authorise } from "@/lib/auth/session";
import type { Permission } from "@/lib/auth/permissions";
import { controlCharacterProblem } from "@/lib/validations/text";

type Params = Record<string, string | string[]>;
type Handler<P extends Params> = (ctx: { req: NextRequest; user: User; params: P }) => Promise<Response> | Response;

const unsafeMethods = new Set(["POST", "PUT", "PATCH", "DELETE"]);

/** The origin (scheme, host and port) the app is served from: APP_URL's, else the request's own. */
function appOrigin(req: NextRequest): string {
  const configured = process.env.APP_URL;
  if (configured) {
    try {
      return new URL(configured).origin;
    } catch {
      // fall through to the request's origin
    }
  }
  return req.nextUrl.origin;
}

/**
 * Refuses state-changing requests whose Origin is not exactly this app's (scheme, host and port of
 * APP_URL). Forwarding headers are not consulted: they are set by whoever sends the request.
 */
export function assertSameOrigin(req: NextRequest): void {
  if (!unsafeMethods.has(req.method)) return;
  const origin = req.headers.get("origin");
  let ok = false;
  try {
    ok = origin !== null && new URL(origin).origin === appOrigin(req);
  } catch {
    ok = false;
  }
  if (!ok) throw new AppError("forbidden", "Cross-origin requests are not accepted.");
}

/**
 * The client's address as the nearest proxy reports it (the last X-Forwarded-For entry; Next.js fills the
 * header with the socket's address when no proxy sent one), for per-client throttling.
 */
export function clientAddress(req: NextRequest): string {
  const forwarded = req.headers.get("x-forwarded-for");
  const last = forwarded?.split(",").pop()?.trim();
  return last ? last.slice(0, 64) : "unknown";
}

export function errorResponse(err: unknown): NextResponse {
  const { status, body } = toErrorResponse(err);
  const headers: Record<string, string> = {};
  if (err instanceof AppError && err.retryAfterS !== undefined) headers["retry-after"] = String(err.retryAfterS);
  return NextResponse.json(body, { status, headers });
}

/** Route parameters never carry control characters (a NUL would otherwise reach the database). */
function assertCleanParams(params: Params | undefined): void {
  for (const [name, value] of Object.entries(params ?? {})) {
    for (const v of Array.isArray(value) ? value : [value]) {
      const problem = controlCharacterProblem(v, { multiLine: false });
      if (problem) throw new AppError("validation", "Some fields need attention.", { [name]: [problem] });
    }
  }
}

/**
 * Wraps a route handler: same-origin check for writes, authentication, authorisation
 * against `permission`, awaited and checked params, and one error mapping.
 */
export function withAuth<P extends Params = Params>(handler: Handler<P>, opts: { permission: Permission | null }) {
  return async (req: NextRequest, ctx: { params: Promise<P> }): Promise<Response> => {
    try {
      assertSameOrigin(req);
      const user = await authorise(opts.permission);
      const params = await ctx.params;
      assertCleanParams(params);
      return await handler({ req, user, params });
    } catch (err) {
      return errorResponse(err);
    }
  };
}

/** Same wrapper for routes that need no session (sign-in, invitation acceptance, share links). */
export function withPublic<P extends Params = Params>(handler: (ctx: { req: NextRequest; params: P }) => Promise<Response> | Response) {
  return async (req: NextRequest, ctx: { params: Promise<P> }): Promise<Response> => {
    try {
      assertSameOrigin(req);
      const params = await ctx.params;
      assertCleanParams(params);
      return await handler({ req, params });
    } catch (err) {
      return errorResponse(err);
    }
  };
}

/** Largest JSON body a signed-in route reads unless it says otherwise (a limit set is ~20 kB). */
export const defaultMaxJsonBytes = 256 * 1024;
/** JSON nested deeper than this is refused before any schema walks it. */
const maxJsonDepth = 64;

/**
 * Reads a JSON body: only `application/json` (415 otherwise), at most `maxBytes` (413, counted while
 * streaming, so a large body is never held), valid UTF-8 and JSON (400), nested at most 64 deep and with no
 * control character in any string or key other than tab, line feed and carriage return (422 naming the field).
 */
export async function readJson(req: NextRequest, { maxBytes = defaultMaxJsonBytes }: { maxBytes?: number } = {}): Promise<unknown> {
  const type = req.headers.get("content-type")?.split(";")[0]?.trim().toLowerCase();
  if (type !== "application/json") {
    throw new AppError("unsupported_media_type", "Send the request body as JSON (Content-Type: application/json).");
  }
  const tooLarge = () => new AppError("payload_too_large", `The request body is larger than ${Math.round(maxBytes / 1024)} kB.`);
  const declared = Number(req.headers.get("content-length") ?? NaN);
  if (Number.isFinite(declared) && declared > maxBytes) throw tooLarge();
  const chunks: Uint8Array[] = [];
  let total = 0;
  if (req.body) {
    const reader = req.body.getReader();
    for (;;) {
      const { done, value } = await reader.read();
      if (done) break;
      total += value.byteLength;
      if (total > maxBytes) {
        await reader.cancel().catch(() => undefined);
        throw tooLarge();
      }
      chunks.push(value);
    }
  }
  let value: unknown;
  try {
    const text = new TextDecoder("utf-8", { fatal: true }).decode(Buffer.concat(chunks));
    value = JSON.parse(text);
  } catch {
    throw new AppError("bad_request", "The request body is not valid JSON.");
  }
  assertCleanJson(value);
  return value;
}

/** Walks parsed JSON (iteratively) for depth and control characters; throws a 422 naming the first bad field. */
function assertCleanJson(root: unknown): void {
  const stack: Array<{ value: unknown; path: string[] }> = [{ value: root, path: [] }];
  while (stack.length > 0) {
    const { value, path } = stack.pop()!;
    const field = path.join(".") || "_";
    if (path.length > maxJsonDepth) {
      throw new AppError("validation", "Some fields need attention.", { [field]: [`Nested more than ${maxJsonDepth} levels deep`] });
    }
    if (typeof value === "string") {
      const problem = controlCharacterProblem(value, { multiLine: true });
      if (problem) throw new AppError("validation", "Some fields need attention.", { [field]: [problem] });
    } else if (Array.isArray(value)) {
      value.forEach((v, i) => stack.push({ value: v, path: [...path, String(i)] }));
    } else if (value !== null && typeof value === "object") {
      for (const [k, v] of Object.entries(value)) {
        const keyProblem = controlCharacterProblem(k, { multiLine: false });
        if (keyProblem) throw new AppError("validation", "Some fields need attention.", { [field]: [`A key ${keyProblem.toLowerCase()}`] });
        stack.push({ value: v, path: [...path, k] });
      }
    }
  }
}
