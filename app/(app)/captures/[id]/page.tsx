import Link from "next/link";
import { z } from "zod";
import { SafetyNote } from "@/app/_components/safety-note";
import { VerdictBadge } from "@/app/_components/verdict-badge";
import { listLimitSetChoices } from "@/db/queries/captures";
import { getSheetView, listSiteSiblings } from "@/db/queries/sheet";
import { orNotFound, requirePage, uuidOr404 } from "@/lib/auth/page";
import { can } from "@/lib/auth/permissions";
import { loadSheetPage } from "@/lib/captures/load-sheet";
import { EvaluationContextSchema } from "@/lib/compliance/model";
import { formatWhen, reviewStateLabels, summariseContext } from "@/lib/reports/format";
import { headlineNumbers } from "@/lib/reports/headline-numbers";
import { CaptureActions } from "./_components/capture-actions";
import { CaptureProgress } from "./_components/capture-progress";
import { ContextForm } from "./_components/context-form";
import { EvaluationHistory } from "./_components/evaluation-history";
import { HeadlineSummary } from "./_components/headline-summary";
import { LimitsLine } from "./_components/limits-line";
import { ReviewPanel } from "./_components/review-panel";
import { SharePanel } from "./_components/share-panel";
import { SheetBodyLoader } from "./_components/sheet-body-loader";
import { SheetHeader, SheetNotes } from "./_components/sheet-header";

export const metadata = { title: "Sheet" };

export default async function CaptureSheetPage({
  params,
  searchParams,
}: {
  params: Promise<{ id: string }>;
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const user = await requirePage("captures:read");
  const { id } = await params;
  const query = await searchParams;
  uuidOr404(id);
  const requested = typeof query.evaluation === "string" && z.uuid().safeParse(query.evaluation).success ? query.evaluation : undefined;
  const channel = typeof query.channel === "string" ? query.channel : undefined;
  // The per-order part (the shown channel's rows) is not rendered here: the browser loads it (SheetBodyLoader).
  const sheet = await orNotFound(loadSheetPage({ captureId: id, evaluationId: requested, reader: user, channel: null }));
  const { capture, evaluation } = sheet;

  // An approved result stays on show while a newer analysis is queued, running or failed.
  if ((capture.status !== "done" && !capture.approvedEvaluationId) || !evaluation) {
    return (
      <div className="max-w-2xl space-y-4">
        <div>
          <p className="text-sm text-ink-soft">{sheet.site.name}</p>
          <h1 data-testid="sheet-title">{capture.title}</h1>
          <p className="text-sm text-ink-soft">
            {capture.originalFilename} · registered {formatWhen(capture.createdAt)}
            {sheet.uploaderName ? ` by ${sheet.uploaderName}` : ""}
          </p>
        </div>
        <CaptureProgress
          initial={{
            capture: {
              id: capture.id,
              status: capture.status,
              progressPercent: capture.progressPercent,
              failureReason: capture.failureReason,
              updatedAt: capture.updatedAt.toISOString(),
            },
          }}
          canFix={can(user.role, "captures:upload")}
        />
        <CaptureActions
          captureId={capture.id}
          kind={capture.kind}
          canSwitchKind={can(user.role, "captures:upload") && ["uploading", "uploaded", "failed"].includes(capture.status) && !sheet.analysis && sheet.evaluations.length === 0}
          canWithdraw={capture.uploadedBy === user.id && capture.reviewState === "draft" && capture.status !== "queued" && capture.status !== "running"}
        />
        <SafetyNote />
      </div>
    );
  }

  const latestId = sheet.evaluations[0]?.id ?? null;
  const canReview = can(user.role, "captures:review");
  const canShare = can(user.role, "captures:share");
  // The evaluation made just before the shown one, to show the two side by side.
  const shownIndex = sheet.evaluations.findIndex((e) => e.id === evaluation.id);
  const previousSummary = shownIndex >= 0 ? sheet.evaluations[shownIndex + 1] : undefined;
  const [limitSets, others, previous] = await Promise.all([
    canReview ? listLimitSetChoices() : Promise.resolve([]),
    listSiteSiblings({ siteId: capture.siteId, exceptId: capture.id, reader: user }),
    previousSummary ? getSheetView({ captureId: capture.id, evaluationId: previousSummary.id, channel: null }) : null,
  ]);
  // The sheet's default is the approved evaluation while one exists, else the newest.
  const defaultId = capture.approvedEvaluationId ?? latestId;
  const evalQuery = evaluation.id !== defaultId ? `?evaluation=${evaluation.id}` : "";
  const context = EvaluationContextSchema.safeParse(evaluation.context);

  return (
    <div className="space-y-4">
      <nav className="text-sm text-ink-soft" aria-label="Breadcrumb">
        <Link href="/captures" className="hover:text-copper">Captures</Link> / <span>{capture.title}</span>
      </nav>
      {sheet.newerResult && evaluation.id !== latestId && (
        <p className="rounded-md border border-caution/40 bg-caution-light px-4 py-2 text-sm text-caution" role="status" data-testid="newer-result">
          A newer result awaits review ({formatWhen(sheet.newerResult.createdAt)}); this sheet shows the approved one until it is approved itself.{" "}
          <Link href={`/captures/${capture.id}?evaluation=${sheet.newerResult.id}`} className="font-semibold underline">Show the newer result</Link>
        </p>
      )}
      {capture.approvedEvaluationId && evaluation.id === latestId && evaluation.id !== capture.approvedEvaluationId && (
        <p className="rounded-md border border-caution/40 bg-caution-light px-4 py-2 text-sm text-caution" role="status" data-testid="unapproved-result">
          This newer result is not approved yet; share links, the PDF and viewers show the approved one.{" "}
          <Link href={`/captures/${capture.id}`} className="font-semibold underline">Show the approved result</Link>
        </p>
      )}
      {evaluation.id !== latestId && evaluation.id !== capture.approvedEvaluationId && (
        <p className="rounded-md border border-caution/40 bg-caution-light px-4 py-2 text-sm text-caution" role="status" data-testid="older-evaluation">
          You are looking at an earlier evaluation ({formatWhen(evaluation.createdAt)}).{" "}
          <Link href={`/captures/${capture.id}`} className="font-semibold underline">Show the latest</Link>
        </p>
      )}
      {capture.status !== "done" && user.role !== "viewer" && (
        <p className="rounded-md border border-caution/40 bg-caution-light px-4 py-2 text-sm text-caution" role="status" data-testid="rerun-status">
          {capture.status === "failed" ? `A new analysis failed: ${capture.failureReason ?? "no reason given"}` : `A new analysis is ${capture.status}`}. The approved result stays on show until a newer one is approved.{" "}
          {can(user.role, "captures:review") && <Link href={`/captures/${capture.id}/setup`} className="font-semibold underline">Set-up</Link>}
        </p>
      )}
      <SheetHeader sheet={sheet} />
      <LimitsLine standard={evaluation.result.limitSet.standard} edition={evaluation.result.limitSet.edition} revisionNumber={evaluation.revisionNumber} verification={sheet.limitsVerification} />
      {/* On narrow screens the review panel sits below the sheet: a way to it near the top. */}
      <p className="flex flex-wrap items-center gap-2 text-sm lg:hidden" data-testid="review-jump">
        <span className="text-ink-soft">Review: {reviewStateLabels[capture.reviewState] ?? capture.reviewState}</span>
        <a href="#review" className="btn-quiet py-1">Go to the review panel</a>
      </p>
      {previous && previousSummary && (
        <section className="panel grid gap-3 text-sm sm:grid-cols-2" data-testid="evaluation-pair">
          {[
            { title: "This evaluation", summary: evaluation, result: evaluation.result, href: null },
            { title: "The one before", summary: previousSummary, result: previous.head, href: `/captures/${capture.id}?evaluation=${previousSummary.id}` },
          ].map((side) => {
            const failing = side.result.failingOrders.map((order) => `h${order}`);
            return (
              <div key={side.title} className="min-w-0">
                <p className="text-xs uppercase tracking-wide text-ink-muted">{side.title}</p>
                <p className="flex flex-wrap items-center gap-2">
                  <VerdictBadge verdict={side.result.verdict} />
                  {side.href ? (
                    <Link href={side.href} className="font-medium hover:text-copper">{side.summary.limitSetName} · rev {side.summary.revisionNumber}</Link>
                  ) : (
                    <span className="font-medium">{side.summary.limitSetName} · rev {side.summary.revisionNumber}</span>
                  )}
                </p>
                <p className="text-ink-soft">{summariseContext(side.result.context)}</p>
                <p className="text-ink-soft">Band: {side.result.band.label ?? "none"} · {failing.length === 0 ? "no order over its limit" : `over the limit: ${failing.join(", ")}`}</p>
              </div>
            );
          })}
        </section>
      )}
      <SafetyNote />

      <div className="grid gap-4 lg:grid-cols-[minmax(0,1fr)_20rem]">
        <div className="min-w-0 space-y-4">
          <HeadlineSummary headline={headlineNumbers(sheet.analysis?.result, evaluation.result.context)} />
          {evaluation.result.channels.length > 0 && (
            <SheetBodyLoader
              bodyUrl={`/api/captures/${capture.id}/sheet-body?evaluation=${evaluation.id}${channel !== undefined ? `&channel=${encodeURIComponent(channel)}` : ""}`}
              chartsUrl={`/api/captures/${capture.id}/charts?evaluation=${evaluation.id}`}
            />
          )}
          <SheetNotes notes={evaluation.result.notes} />
        </div>

        <aside className="min-w-0 space-y-4">
          <div id="review" className="scroll-mt-4">
          <ReviewPanel
            captureId={capture.id}
            reviewState={capture.reviewState}
            events={sheet.reviews.map((r) => ({ ...r, createdAt: r.createdAt.toISOString() }))}
            canSubmit={can(user.role, "captures:upload")}
            canDecide={canReview}
            evaluationId={evaluation.id}
            newestEvaluationId={latestId}
          />
          </div>
          <section className="panel space-y-2" data-testid="downloads">
            <h2>Report</h2>
            <div className="flex flex-wrap gap-2">
              <a href={`/api/captures/${capture.id}/report${evalQuery}`} className="btn-quiet" data-testid="download-pdf">PDF report</a>
              <a href={`/api/captures/${capture.id}/sheet-csv${evalQuery}`} className="btn-quiet" data-testid="download-csv">Sheet as CSV</a>
            </div>
          </section>
          {canShare && <SharePanel captureId={capture.id} />}
          {others.length > 0 && (
            <section className="panel" data-testid="compare-panel">
              <h2 className="mb-2">Compare with…</h2>
              <form action="/captures/compare" method="get" className="space-y-2">
                <input type="hidden" name="a" value={capture.id} />
                <label htmlFor="compare-b" className="field-label">Another capture of this site</label>
                <select id="compare-b" name="b" className="field-input" data-testid="compare-select">
                  {others.map((c) => (
                    <option key={c.id} value={c.id}>
                      {c.title} ({c.createdAt.toISOString().slice(0, 10)})
                    </option>
                  ))}
                </select>
                <button type="submit" className="btn-quiet w-full" data-testid="compare-go">Compare</button>
              </form>
            </section>
          )}
          {canReview && (
            <section className="panel" data-testid="context-panel">
              <h2 className="mb-2">Change the context</h2>
              <ContextForm
                captureId={capture.id}
                limitSets={limitSets}
                initialKey={evaluation.limitSetKey}
                initialContext={context.success ? context.data : {}}
                conditions={evaluation.result.conditions.map((c) => ({ id: c.id, text: c.text }))}
              />
            </section>
          )}
          <EvaluationHistory captureId={capture.id} evaluations={sheet.evaluations} currentId={evaluation.id} />
        </aside>
      </div>
    </div>
  );
}
