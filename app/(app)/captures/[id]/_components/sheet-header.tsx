import { VerdictBadge } from "@/app/_components/verdict-badge";
import type { Sheet, SheetPage } from "@/lib/captures/load-sheet";
import { describeSetup } from "@/lib/reports/describe-setup";
import { describeSignOff } from "@/lib/reports/describe-sign-off";
import { describeContext, formatWhen } from "@/lib/reports/format";

/** Who, what, when and against which limits: the top of every sheet (signed-in and shared). */
export function SheetHeader({ sheet }: { sheet: Sheet | SheetPage }) {
  const { capture, site, evaluation } = sheet;
  if (!evaluation) return null;
  const result = evaluation.result;
  const context = describeContext(result.context);
  const signOff = describeSignOff(sheet);
  const setup = describeSetup(sheet);
  return (
    <section className="panel space-y-4" data-testid="sheet-header">
      <div className="flex flex-wrap items-start justify-between gap-3">
        <div className="min-w-0 flex-1 basis-80">
          <p className="text-sm text-ink-soft" data-testid="sheet-site">{site.name}</p>
          <h1 className="break-words" data-testid="sheet-title">{capture.title}</h1>
          <p className="mt-1 text-sm text-ink-soft">
            Captured {capture.capturedAt ? formatWhen(capture.capturedAt) : "(time not given)"} · uploaded {formatWhen(capture.createdAt)}
            {sheet.uploaderName ? ` by ${sheet.uploaderName}` : ""} · {capture.originalFilename}
          </p>
        </div>
        <div className="flex flex-col items-start gap-1 sm:max-w-64 sm:items-end sm:text-right">
          <span className="text-xs uppercase tracking-wide text-ink-muted">Overall verdict</span>
          <VerdictBadge verdict={result.verdict} size="lg" testId="sheet-verdict" />
          <span className={`text-xs ${signOff.approved ? "font-semibold text-pass" : "text-ink-muted"}`} data-testid="review-state-chip" data-approved={signOff.approved}>
            Sign-off: {signOff.label}
          </span>
        </div>
      </div>
      <dl className="grid gap-x-6 gap-y-3 text-sm sm:grid-cols-2 lg:grid-cols-3">
        <Fact label="Limit set" testId="sheet-limit-set">
          <span className="font-medium">{evaluation.limitSetName}</span>
          <span className="block text-ink-soft">
            {result.limitSet.standard}, {result.limitSet.edition} · <span data-testid="sheet-revision">revision {evaluation.revisionNumber}</span>
          </span>
        </Fact>
        <Fact label="Band" testId="sheet-band">
          <span className="font-medium">{result.band.label ?? "none chosen"}</span>
          <span className="block text-ink-soft">{result.band.reason}</span>
          {result.band.options && result.band.options.length > 0 && (
            <span className="mt-1 flex flex-wrap gap-1">
              {result.band.options.map((o) => (
                <span key={o.label} className="inline-flex items-center gap-1 text-xs">
                  {o.label} <VerdictBadge verdict={o.verdict} />
                </span>
              ))}
            </span>
          )}
        </Fact>
        <Fact label="Context" testId="sheet-context">
          {context.length === 0 ? (
            <span className="text-ink-soft">No context values given.</span>
          ) : (
            <ul>
              {context.map(([k, v]) => (
                <li key={k}>
                  <span className="text-ink-soft">{k}</span> {v}
                </li>
              ))}
            </ul>
          )}
        </Fact>
        <Fact label="Evaluated" wide className="text-ink-soft">
          {formatWhen(evaluation.createdAt)} {evaluation.createdByName ? `by ${evaluation.createdByName}` : "automatically after the analysis"}
          {result.channel ? ` · worst channel ${result.channel}` : ""}
        </Fact>
        {setup.length > 0 && (
          <Fact label="Set-up behind this result" wide testId="sheet-setup">
            <ul>
              {setup.map(([k, v, details]) => (
                <li key={k} className="[overflow-wrap:anywhere]">
                  <span className="text-ink-soft">{k}</span> {v}
                  {details && details.length > 0 && (
                    <details className="mt-1" data-testid="setup-details">
                      <summary className="cursor-pointer text-copper-dark">Show all {details.length}</summary>
                      <ul className="mt-1 columns-1 text-xs text-ink-soft sm:columns-2 lg:columns-3">
                        {details.map((d) => <li key={d} className="[overflow-wrap:anywhere]">{d}</li>)}
                      </ul>
                    </details>
                  )}
                </li>
              ))}
            </ul>
          </Fact>
        )}
      </dl>
    </section>
  );
}

/** One term of the header's description list: its label above what it says (`wide`: the whole row). */
function Fact({ label, wide = false, testId, className, children }: { label: string; wide?: boolean; testId?: string; className?: string; children: React.ReactNode }) {
  return (
    <div className={wide ? "sm:col-span-2 lg:col-span-3" : undefined}>
      <dt className="text-xs uppercase tracking-wide text-ink-muted">{label}</dt>
      <dd data-testid={testId} className={className}>
        {children}
      </dd>
    </div>
  );
}

/** The evaluator's rules and caveats for this evaluation. */
export function SheetNotes({ notes }: { notes: string[] }) {
  if (notes.length === 0) return null;
  return (
    <section className="panel text-sm" data-testid="sheet-notes">
      <h2 className="mb-2">Notes</h2>
      <ul className="list-disc space-y-1 pl-5 text-ink-soft">
        {notes.map((n) => <li key={n}>{n}</li>)}
      </ul>
    </section>
  );
}
