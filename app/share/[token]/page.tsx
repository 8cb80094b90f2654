import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { SafetyFooter, SafetyNote } from "@/app/_components/safety-note";
import { formatWhen, reviewActionLabels } from "@/lib/reports/format";
import { loadSharedSheetPage } from "@/lib/reports/load-shared-sheet";
import { HeadlineSummary } from "@/app/(app)/captures/[id]/_components/headline-summary";
import { LimitsLine } from "@/app/(app)/captures/[id]/_components/limits-line";
import { SheetBody } from "@/app/(app)/captures/[id]/_components/sheet-body";
import { headlineNumbers } from "@/lib/reports/headline-numbers";
import { sheetBodyData } from "@/lib/reports/sheet-body-data";
import { SheetHeader, SheetNotes } from "@/app/(app)/captures/[id]/_components/sheet-header";
import { orNotFound } from "@/lib/auth/page";

export const metadata: Metadata = { title: "Shared sheet", robots: { index: false, follow: false } };

/** A read-only sheet opened with a share link: no session, no actions, no way into the rest of the app. */
export default async function SharedSheetPage({
  params,
  searchParams,
}: {
  params: Promise<{ token: string }>;
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const { token } = await params;
  const { channel } = await searchParams;
  const sheet = await orNotFound(loadSharedSheetPage({ token, channel: typeof channel === "string" ? channel : undefined }));
  const evaluation = sheet.evaluation;
  if (!evaluation) notFound();
  const signOffs = sheet.reviews.filter((r) => r.action !== "comment");
  return (
    <div className="flex min-h-screen flex-col">
      <header className="border-b border-line bg-ink text-paper">
        <div className="mx-auto flex max-w-6xl flex-wrap items-center gap-3 px-4 py-3">
          <span className="flex items-center gap-2 text-lg font-semibold tracking-tight">
            <span aria-hidden className="inline-block h-4 w-4 rounded-sm bg-copper" />
            Ordwise
          </span>
          <span className="text-sm text-paper/80" data-testid="share-expiry">Shared, read-only sheet · this link works until {formatWhen(sheet.shareExpiresAt)}</span>
          <a href={`/api/shared/${token}/report`} className="ml-auto rounded-md bg-copper px-3 py-1.5 text-sm font-medium text-white hover:bg-copper-dark" data-testid="shared-pdf">
            Download PDF
          </a>
        </div>
      </header>
      <main className="mx-auto w-full max-w-6xl flex-1 space-y-4 px-4 py-6" data-testid="shared-sheet">
        <SheetHeader sheet={sheet} />
        <LimitsLine standard={evaluation.result.limitSet.standard} edition={evaluation.result.limitSet.edition} revisionNumber={evaluation.revisionNumber} verification={sheet.limitsVerification} />
        <div className="rounded-md border border-caution/30 bg-caution-light/50 px-3 py-2">
          <SafetyNote />
        </div>
        <HeadlineSummary headline={headlineNumbers(sheet.analysis?.result, evaluation.result.context)} />
        {evaluation.shownChannel && <SheetBody payload={sheetBodyData(evaluation.result, evaluation.shownChannel)} chartsUrl={`/api/shared/${token}/charts`} />}
        <SheetNotes notes={evaluation.result.notes} />
        <section className="panel text-sm" data-testid="shared-signoff">
          <h2 className="mb-2">Sign-off</h2>
          {signOffs.length === 0 ? (
            <p className="text-ink-soft">Not yet reviewed.</p>
          ) : (
            <ul className="space-y-1">
              {signOffs.map((r) => (
                <li key={r.id}>
                  {reviewActionLabels[r.action] ?? r.action} by {r.actorName ?? "unknown"} <span className="text-ink-muted">· {formatWhen(r.createdAt)}</span>
                </li>
              ))}
            </ul>
          )}
        </section>
      </main>
      <SafetyFooter />
    </div>
  );
}
