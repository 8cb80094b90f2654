// The one poll loop of the tests: ask until there is an answer or the time is up.

/**
 * Calls `probe` every `intervalMs` until it gives something other than null/undefined and returns
 * that; after `timeoutMs` throws "timed out waiting for <what>" (with `explain()`'s words, if given).
 */
export async function pollFor<T>(
  what: string,
  probe: () => Promise<T | null | undefined>,
  { timeoutMs = 30_000, intervalMs = 200, explain }: { timeoutMs?: number; intervalMs?: number; explain?: () => Promise<string> } = {},
): Promise<T> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const value = await probe();
    if (value !== null && value !== undefined) return value;
    if (Date.now() > deadline) throw new Error(`timed out waiting for ${what} (${timeoutMs / 1000} s)${explain ? `: ${await explain()}` : ""}`);
    await new Promise((r) => setTimeout(r, intervalMs));
  }
}
