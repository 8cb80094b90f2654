"use client";

import { useState } from "react";
import { mutate } from "swr";
import { useRequest } from "@/app/_components/use-request";
import { VerdictBadge } from "@/app/_components/verdict-badge";
import { describeMitigation } from "@/lib/mitigation/describe-mitigation";
import type { MitigationStudyInputs } from "@/lib/mitigation/study-inputs";
import type { Mitigation } from "@/lib/mitigation/types";
import { formatWhen } from "@/lib/reports/format";
import { sendJson } from "@/lib/swr/fetcher";
import { captureStudiesKey, useMitigationStudies, type SavedStudyDto } from "@/lib/swr/use-mitigation-studies";

/** Saves the prediction shown as a study of the capture (optionally for the PDF report). */
export function SaveStudy({ base, evaluationId, inputs }: { base: string; evaluationId: string | null; inputs: MitigationStudyInputs }) {
  const { data } = useMitigationStudies(base);
  const [title, setTitle] = useState("");
  const [includeInReport, setInclude] = useState(true);
  const [saved, setSaved] = useState(false);
  const { busy, error, run } = useRequest();
  if (!data?.canSave) return null;
  async function save(e: React.FormEvent) {
    e.preventDefault();
    setSaved(false);
    await run(async () => {
      await sendJson(`${base}/studies`, "POST", { title, includeInReport, inputs, ...(evaluationId ? { evaluationId } : {}) });
      setSaved(true);
      setTitle("");
      await mutate(captureStudiesKey(base));
    }, "The study was not saved.");
  }
  const message = error ?? (saved ? "Study saved." : null);
  return (
    <form onSubmit={save} className="mt-3 flex flex-wrap items-center gap-3 border-t border-line pt-3" data-testid="save-study">
      <input value={title} onChange={(e) => setTitle(e.target.value)} placeholder="Study title" className="field-input w-72 py-1" data-testid="study-title" aria-label="Study title" />
      <label className="flex items-center gap-2">
        <input type="checkbox" checked={includeInReport} onChange={(e) => setInclude(e.target.checked)} className="h-4 w-4 accent-copper" data-testid="study-include" />
        include in the PDF report
      </label>
      <button type="submit" className="btn-primary" disabled={busy} data-testid="study-save">
        Save study
      </button>
      {message && <span role="status" data-testid="study-message">{message}</span>}
    </form>
  );
}

/** Where a saved study started from, as the list shows it beside the study. */
function startedFrom(study: SavedStudyDto, shownId: string | null, approvedId: string | null): { text: string; elsewhere: boolean } {
  if (!study.evaluationId || !study.evaluationCreatedAt) return { text: "starting evaluation not recorded", elsewhere: true };
  const when = formatWhen(new Date(study.evaluationCreatedAt));
  const approved = study.evaluationId === approvedId ? "approved " : "";
  if (study.evaluationId === shownId) return { text: `from this sheet's ${approved}evaluation (${when})`, elsewhere: false };
  return { text: `from another ${approved}evaluation (${when})`, elsewhere: true };
}

/** The capture's saved studies, each with where it started from. */
export function SavedStudies({ base, evaluationId }: { base: string; evaluationId: string | null }) {
  const { data, error } = useMitigationStudies(base);
  // The sheet without ?evaluation= shows its default (approved, else newest): the studies of the approved one are "this sheet's".
  const shownId = evaluationId ?? data?.approvedEvaluationId ?? null;
  const captureHref = base.replace(/^\/api/, "");
  return (
    <section className="panel text-sm" data-testid="saved-studies" aria-labelledby="saved-studies-heading">
      <h2 id="saved-studies-heading" className="mb-2">Mitigation studies — predictions</h2>
      {error && <p className="text-fail">{error.message}</p>}
      {data && data.studies.length === 0 && <p className="text-ink-muted">No saved studies.</p>}
      <ul className="space-y-2">
        {data?.studies.map((s) => {
          const from = startedFrom(s, shownId, data.approvedEvaluationId);
          return (
            <li key={s.id} className="border-t border-line pt-2" data-testid="saved-study" data-evaluation={s.evaluationId ?? ""}>
              <div className="flex flex-wrap items-center gap-2">
                <span className="font-medium">{s.title}</span>
                {s.predictedVerdict !== "none" && <VerdictBadge verdict={s.predictedVerdict} />}
                <span className="text-ink-muted">predicted</span>
                {s.includeInReport && <span className="text-ink-muted">· in the PDF</span>}
              </div>
              <div className="text-ink-soft">
                {s.inputs.mitigations.map((m) => describeMitigation(m as Mitigation)).join(" + ")} · {s.authorName ?? "unknown"}, {formatWhen(new Date(s.createdAt))} · model {s.modelVersion}
              </div>
              <div className={from.elsewhere ? "text-caution" : "text-ink-soft"} data-testid="study-started-from">
                Starts {from.text}
                {from.elsewhere && s.evaluationId && (
                  <>
                    {" — "}
                    <a className="underline" href={`${captureHref}?evaluation=${s.evaluationId}`}>open that evaluation</a>
                  </>
                )}
              </div>
            </li>
          );
        })}
      </ul>
    </section>
  );
}
