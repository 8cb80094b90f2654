"use client";

import { useState } from "react";
import { FetchError } from "@/lib/swr/fetcher";

/**
 * The state of a form or button that sends a request: `busy` while `run` awaits its action, then the
 * failure's message (the server's, else `fallback`) in `error` and the fields a refused request named
 * in `fieldErrors`. `run` clears both first and resolves to whether the action succeeded.
 *
 * @example
 * const { busy, error, run } = useRequest();
 * <button disabled={busy} onClick={() => run(() => sendJson(url, "DELETE"), "The link was not revoked.")}>Revoke</button>
 */
export function useRequest() {
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [fieldErrors, setFieldErrors] = useState<Record<string, string[]>>({});
  async function run(action: () => Promise<unknown>, fallback: string): Promise<boolean> {
    setBusy(true);
    setError(null);
    setFieldErrors({});
    try {
      await action();
      return true;
    } catch (err) {
      setError(err instanceof Error ? err.message : fallback);
      if (err instanceof FetchError && err.fieldErrors) setFieldErrors(err.fieldErrors);
      return false;
    } finally {
      setBusy(false);
    }
  }
  return { busy, error, setError, fieldErrors, setFieldErrors, run };
}
