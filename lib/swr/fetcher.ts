// The one fetcher behind every SWR hook: JSON in, typed error out.
export class FetchError extends Error {
  constructor(
    message: string,
    readonly status: number,
    readonly fieldErrors?: Record<string, string[]>,
  ) {
    super(message);
  }
}

export async function fetcher<T>(url: string): Promise<T> {
  const res = await fetch(url, { headers: { accept: "application/json" } });
  if (!res.ok) throw await toFetchError(res);
  return (await res.json()) as T;
}

export async function toFetchError(res: Response): Promise<FetchError> {
  try {
    const body = (await res.json()) as { error?: { message?: string; fieldErrors?: Record<string, string[]> } };
    return new FetchError(body.error?.message ?? `Request failed (${res.status})`, res.status, body.error?.fieldErrors);
  } catch {
    return new FetchError(`Request failed (${res.status})`, res.status);
  }
}

/** Sends JSON with a write method; resolves to the parsed body or throws FetchError. */
export async function sendJson<T>(url: string, method: "POST" | "PUT" | "PATCH" | "DELETE", body?: unknown): Promise<T> {
  const res = await fetch(url, {
    method,
    headers: { "content-type": "application/json", accept: "application/json" },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  if (!res.ok) throw await toFetchError(res);
  return (await res.json()) as T;
}
