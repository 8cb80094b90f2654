import { describe, expect, it } from "vitest";
import { reviewTransition } from "@/lib/reviews/review-transition";

// The product's review workflow (a product rule, common practice, no source), as DEVELOPERS.md states it:
// draft → in review → approved | sent back; sent back → in review; approved → (new result) in review.
describe("reviewTransition", () => {
  it.each([
    ["draft", "submitted", "in_review"],
    ["in_review", "approved", "approved"],
    ["in_review", "sent_back", "sent_back"],
    ["sent_back", "submitted", "in_review"],
    ["approved", "new_result", "in_review"],
    ["in_review", "new_result", "in_review"],
    ["draft", "comment", "draft"],
  ] as const)("%s --%s--> %s", (from, event, to) => {
    expect(reviewTransition(from, event)).toEqual({ ok: true, next: to });
  });

  it.each([
    // The reproduced attacks: approving a never-submitted capture, approving twice, withdrawing an approval by submitting.
    ["draft", "approved", ["submitted", "comment", "new_result"]],
    ["approved", "approved", ["new_result", "comment"]],
    ["approved", "submitted", ["new_result", "comment"]],
    ["approved", "sent_back", ["new_result", "comment"]],
    ["sent_back", "approved", ["submitted", "comment", "new_result"]],
    ["in_review", "submitted", ["approved", "sent_back", "comment", "new_result"]],
  ] as const)("refuses %s --%s--> and names the allowed events", (from, event, allowed) => {
    const t = reviewTransition(from, event);
    expect(t.ok).toBe(false);
    if (!t.ok) expect([...t.allowed].sort()).toEqual([...allowed].sort());
  });
});
