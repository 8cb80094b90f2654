import { describe, expect, it } from "vitest";
import { describeSignOff } from "@/lib/reports/describe-sign-off";

const approval = { actorName: "Teodor Vance", createdAt: new Date("2026-03-04T10:20:00Z"), comment: "fail confirmed" };

// Issue 10 §1 of this repository: the word "Approved" belongs to the approved evaluation only.
describe("describeSignOff", () => {
  it("names approver and time on the approved evaluation", () => {
    const s = describeSignOff({ capture: { reviewState: "approved", approvedEvaluationId: "e1" }, evaluation: { id: "e1" }, approval });
    expect(s.approved).toBe(true);
    expect(s.label).toContain("Approved by Teodor Vance on 2026-03-04");
  });

  it("never calls a newer evaluation approved, even while the capture's state says approved", () => {
    for (const reviewState of ["approved", "in_review"]) {
      const s = describeSignOff({ capture: { reviewState, approvedEvaluationId: "e1" }, evaluation: { id: "e2" }, approval });
      expect(s.approved).toBe(false);
      expect(s.label).not.toMatch(/^Approved/);
    }
  });

  it("shows the review state of a capture never approved", () => {
    expect(describeSignOff({ capture: { reviewState: "in_review", approvedEvaluationId: null }, evaluation: { id: "e1" }, approval: null })).toEqual({ approved: false, label: "In review" });
  });
});
