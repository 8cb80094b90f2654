"use client";

import { useSheetBody } from "@/lib/swr/use-sheet-body";
import { SheetBody } from "./sheet-body";

/**
 * The signed-in sheet's per-order part, loaded by the browser from `bodyUrl` (keyed by the evaluation's id,
 * so it is fetched once and then kept) instead of being rendered into every page: the page itself carries
 * the header, headline numbers, notes and review panel. The share page renders SheetBody directly.
 */
export function SheetBodyLoader({ bodyUrl, chartsUrl }: { bodyUrl: string; chartsUrl: string }) {
  const { data, error } = useSheetBody(bodyUrl);
  if (error) {
    return (
      <p className="panel text-sm text-fail" role="alert" data-testid="sheet-body-error">
        The per-order results could not be loaded: {error instanceof Error ? error.message : "unknown error"}. Reload the page to try again.
      </p>
    );
  }
  if (!data) {
    return (
      <p className="panel text-sm text-ink-soft" role="status" aria-live="polite" data-testid="sheet-body-loading">
        Loading the per-order results…
      </p>
    );
  }
  return data.body ? <SheetBody payload={data.body} chartsUrl={chartsUrl} /> : null;
}
