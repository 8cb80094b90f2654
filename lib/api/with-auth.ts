import "server-only";
import { NextResponse, type NextRequest } from "next/server";
import type { User } from "lucia";
import { AppError, toErrorResponse } from "@/lib/errors";
import { authorise } from "@/lib/auth/session";
import type { Permission } from "@/lib/auth/permissions";

type Params = Record<string, string | string[]>;
type Handler<P extends Params> = (ctx: { req: NextRequest; user: User; params: P }) => Promise<Response> | Response;

const unsafeMethods = new Set(["POST", "PUT", "PATCH", "DELETE"]);

/** Refuses state-changing requests whose Origin is not this app (CSRF). */
export function assertSameOrigin(req: NextRequest): void {
  if (!unsafeMethods.has(req.method)) return;
  const origin = req.headers.get("origin");
  const host = req.headers.get("x-forwarded-host") ?? req.headers.get("host");
  if (!origin || !host) throw new AppError("forbidden", "Cross-origin requests are not accepted.");
  let originHost: string;
  try {
    originHost = new URL(origin).host;
  } catch {
    throw new AppError("forbidden", "Cross-origin requests are not accepted.");
  }
  if (originHost !== host) throw new AppError("forbidden", "Cross-origin requests are not accepted.");
}

export function errorResponse(err: unknown): NextResponse {
  const { status, body } = toErrorResponse(err);
  return NextResponse.json(body, { status });
}

/**
 * Wraps a route handler: same-origin check for writes, authentication, authorisation
 * against `permission`, awaited params, and one error mapping.
 */
export function withAuth<P extends Params = Params>(handler: Handler<P>, opts: { permission: Permission | null }) {
  return async (req: NextRequest, ctx: { params: Promise<P> }): Promise<Response> => {
    try {
      assertSameOrigin(req);
      const user = await authorise(opts.permission);
      return await handler({ req, user, params: await ctx.params });
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
      return await handler({ req, params: await ctx.params });
    } catch (err) {
      return errorResponse(err);
    }
  };
}

/** Parses a JSON body, turning malformed JSON into a clear 400. */
export async function readJson(req: NextRequest): Promise<unknown> {
  try {
    return await req.json();
  } catch {
    throw new AppError("bad_request", "The request body is not valid JSON.");
  }
}
