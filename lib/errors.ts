// One error type for expected failures, one mapping to HTTP, one serializer.
import { z } from "zod";

export type AppErrorCode =
  | "bad_request"
  | "unauthorized"
  | "forbidden"
  | "not_found"
  | "method_not_allowed"
  | "conflict"
  | "payload_too_large"
  | "unsupported_media_type"
  | "validation"
  | "too_many_requests"
  | "internal";

const statusByCode: Record<AppErrorCode, number> = {
  bad_request: 400,
  unauthorized: 401,
  forbidden: 403,
  not_found: 404,
  method_not_allowed: 405,
  conflict: 409,
  payload_too_large: 413,
  unsupported_media_type: 415,
  validation: 422,
  too_many_requests: 429,
  internal: 500,
};

export class AppError extends Error {
  readonly code: AppErrorCode;
  readonly fieldErrors?: Record<string, string[]>;
  /** For "too_many_requests": seconds until a retry can succeed (sent as Retry-After). */
  readonly retryAfterS?: number;

  constructor(code: AppErrorCode, message: string, fieldErrors?: Record<string, string[]>, retryAfterS?: number) {
    super(message);
    this.name = "AppError";
    this.code = code;
    this.fieldErrors = fieldErrors;
    this.retryAfterS = retryAfterS;
  }

  get status(): number {
    return statusByCode[this.code];
  }
}

export interface ErrorBody {
  error: { code: AppErrorCode; message: string; fieldErrors?: Record<string, string[]> };
}

/** Field errors keyed by dotted path, from a zod error. */
export function fieldErrorsOf(error: z.ZodError): Record<string, string[]> {
  const out: Record<string, string[]> = {};
  for (const issue of error.issues) {
    const key = issue.path.join(".") || "_";
    (out[key] ??= []).push(issue.message);
  }
  return out;
}

/** Converts anything thrown into a status and a body that is safe to show. */
export function toErrorResponse(err: unknown): { status: number; body: ErrorBody } {
  if (err instanceof AppError) {
    return {
      status: err.status,
      body: { error: { code: err.code, message: err.message, ...(err.fieldErrors ? { fieldErrors: err.fieldErrors } : {}) } },
    };
  }
  if (err instanceof z.ZodError) {
    return {
      status: 422,
      body: { error: { code: "validation", message: "Some fields need attention.", fieldErrors: fieldErrorsOf(err) } },
    };
  }
  // Database and other internals are logged, never shown.
  console.error(err);
  return { status: 500, body: { error: { code: "internal", message: "Something went wrong on our side. Try again." } } };
}
