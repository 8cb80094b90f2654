// The review workflow of a capture as a small explicit state machine. Pure: no database, no framework.

export const reviewStates = ["draft", "in_review", "approved", "sent_back"] as const;
export type ReviewState = (typeof reviewStates)[number];

/** What moves a capture's review: a person's decision, or a new result (analysis or evaluation) being stored. */
export type ReviewEvent = "submitted" | "approved" | "sent_back" | "comment" | "new_result";

// Each state's allowed events and where they lead. A comment never moves the state.
// A new result leaves draft/in review/sent back where they are; after approval it starts a new review,
// because the approval covers the approved evaluation only.
const table: Record<ReviewState, Partial<Record<ReviewEvent, ReviewState>>> = {
  draft: { submitted: "in_review", comment: "draft", new_result: "draft" },
  in_review: { approved: "approved", sent_back: "sent_back", comment: "in_review", new_result: "in_review" },
  sent_back: { submitted: "in_review", comment: "sent_back", new_result: "sent_back" },
  approved: { new_result: "in_review", comment: "approved" },
};

export type ReviewTransition = { ok: true; next: ReviewState } | { ok: false; allowed: ReviewEvent[] };

/**
 * The state a capture's review moves to on `event`, or the events allowed from `state` when
 * `event` is not one of them (the caller answers 409 naming them). O(1).
 *
 * @example reviewTransition("draft", "approved") // { ok: false, allowed: ["submitted", "comment", "new_result"] }
 * @example reviewTransition("in_review", "approved") // { ok: true, next: "approved" }
 */
export function reviewTransition(state: ReviewState, event: ReviewEvent): ReviewTransition {
  const next = table[state][event];
  if (next) return { ok: true, next };
  return { ok: false, allowed: Object.keys(table[state]) as ReviewEvent[] };
}
