import Link from "next/link";
import { VerdictBadge } from "@/app/_components/verdict-badge";
import type { Sheet } from "@/lib/captures/load-sheet";
import { formatWhen, summariseContext } from "@/lib/reports/format";

/** Every evaluation of the capture, newest first; each opens the sheet as it was judged then. */
export function EvaluationHistory({ captureId, evaluations, currentId }: { captureId: string; evaluations: Sheet["evaluations"]; currentId: string | null }) {
  return (
    <section className="panel" data-testid="evaluation-history">
      <h2 className="mb-2">Evaluations</h2>
      <ol className="space-y-2 text-sm">
        {evaluations.map((e, i) => {
          const current = e.id === currentId;
          return (
            <li key={e.id} className={`rounded-md border px-3 py-2 ${current ? "border-copper bg-copper-light/50" : "border-line"}`} data-testid="evaluation-item" data-current={current || undefined}>
              <div className="flex flex-wrap items-center justify-between gap-2">
                <Link href={`/captures/${captureId}?evaluation=${e.id}`} className="font-medium hover:text-copper" data-testid="evaluation-link">
                  {e.limitSetName} · rev {e.revisionNumber}
                </Link>
                <VerdictBadge verdict={e.verdict} />
              </div>
              <p className="text-xs text-ink-soft">{summariseContext(e.context)}</p>
              <p className="text-xs text-ink-muted">
                {formatWhen(e.createdAt)} · {e.createdByName ?? "automatic"}
                {i === 0 ? " · latest" : ""}
                {current ? " · shown" : ""}
              </p>
            </li>
          );
        })}
      </ol>
    </section>
  );
}
