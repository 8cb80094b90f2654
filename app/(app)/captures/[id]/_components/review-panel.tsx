"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { reviewActionLabels, reviewStateLabels, formatWhen } from "@/lib/reports/format";
import { sendJson } from "@/lib/swr/fetcher";

type Action = "submitted" | "approved" | "sent_back" | "comment";

export interface ReviewEventView {
  id: string;
  action: string;
  comment: string;
  createdAt: string;
  actorName: string | null;
  actorRole: string | null;
}

const stateStyle: Record<string, string> = {
  draft: "bg-idle-light text-idle",
  in_review: "bg-caution-light text-caution",
  approved: "bg-pass-light text-pass",
  sent_back: "bg-fail-light text-fail",
};

/** Review state, its history, and the actions the signed-in role may take. */
export function ReviewPanel({
  captureId,
  reviewState,
  events,
  canSubmit,
  canDecide,
  evaluationId,
  newestEvaluationId,
}: {
  captureId: string;
  reviewState: string;
  events: ReviewEventView[];
  canSubmit: boolean;
  canDecide: boolean;
  /** The evaluation on screen; a decision is about it. */
  evaluationId: string;
  /** The newest evaluation: only it can be approved. */
  newestEvaluationId: string | null;
}) {
  const router = useRouter();
  const [comment, setComment] = useState("");
  const [busy, setBusy] = useState<Action | null>(null);
  const [error, setError] = useState<string | null>(null);

  async function act(action: Action) {
    if ((action === "sent_back" || action === "comment") && comment.trim() === "") {
      setError(action === "sent_back" ? "Say why it is sent back." : "Write a comment first.");
      return;
    }
    setBusy(action);
    setError(null);
    try {
      await sendJson(`/api/captures/${captureId}/review`, "POST", { action, comment: comment.trim(), evaluationId });
      setComment("");
      router.refresh();
    } catch (err) {
      setError(err instanceof Error ? err.message : "That did not work.");
    } finally {
      setBusy(null);
    }
  }

  const canAct = canSubmit || canDecide;
  // The buttons follow the server's state machine (lib/reviews/review-transition.ts); the server enforces it.
  const inReview = reviewState === "in_review";
  const showsNewest = evaluationId === newestEvaluationId;
  return (
    <section className="panel space-y-3" data-testid="review-panel">
      <div className="flex items-center justify-between gap-2">
        <h2>Review</h2>
        <span className={`rounded px-2 py-0.5 text-xs font-semibold ${stateStyle[reviewState] ?? ""}`} data-testid="review-state">
          {reviewStateLabels[reviewState] ?? reviewState}
        </span>
      </div>
      {events.length === 0 ? (
        <p className="text-sm text-ink-muted">
          {/* A viewer is not shown the team's review history: do not claim there is none under "Approved". */}
          {canAct || reviewState === "draft" ? "No review activity yet." : "The review history stays with the team; the sign-off above names the approver."}
        </p>
      ) : (
        <ol className="space-y-2 border-l-2 border-line pl-3 text-sm" data-testid="review-history">
          {events.map((e) => (
            <li key={e.id} data-testid="review-event" data-action={e.action}>
              <p>
                <span className="font-medium">{reviewActionLabels[e.action] ?? e.action}</span>{" "}
                <span className="text-ink-soft">by {e.actorName ?? "unknown"}</span>
              </p>
              {e.comment && <p className="whitespace-pre-wrap break-words text-ink">“{e.comment}”</p>}
              <p className="text-xs text-ink-muted">{formatWhen(e.createdAt)}</p>
            </li>
          ))}
        </ol>
      )}
      {canAct && (
        <div className="space-y-2 border-t border-line pt-3">
          <label htmlFor="review-comment" className="field-label">
            Comment {canDecide ? "(required to send back)" : ""}
          </label>
          <textarea
            id="review-comment"
            rows={3}
            value={comment}
            onChange={(e) => setComment(e.target.value)}
            maxLength={4000}
            className="field-input"
            data-testid="review-comment"
          />
          {error && <p className="field-error" role="alert" data-testid="review-error">{error}</p>}
          <div className="flex flex-wrap gap-2">
            {canDecide && inReview && showsNewest && (
              <button type="button" className="btn-primary" disabled={busy !== null} onClick={() => act("approved")} data-testid="review-approve">
                {busy === "approved" ? "Approving…" : "Approve"}
              </button>
            )}
            {canDecide && inReview && (
              <button type="button" className="btn-quiet" disabled={busy !== null} onClick={() => act("sent_back")} data-testid="review-send-back">
                {busy === "sent_back" ? "Sending back…" : "Send back"}
              </button>
            )}
            {canSubmit && (reviewState === "draft" || reviewState === "sent_back") && (
              <button type="button" className={canDecide ? "btn-quiet" : "btn-primary"} disabled={busy !== null} onClick={() => act("submitted")} data-testid="review-submit">
                {busy === "submitted" ? "Submitting…" : "Submit for review"}
              </button>
            )}
            <button type="button" className="btn-quiet" disabled={busy !== null} onClick={() => act("comment")} data-testid="review-add-comment">
              {busy === "comment" ? "Saving…" : "Comment"}
            </button>
          </div>
        </div>
      )}
    </section>
  );
}
