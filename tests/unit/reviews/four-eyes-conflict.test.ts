import { describe, expect, it } from "vitest";
import { fourEyesConflict } from "@/lib/reviews/four-eyes-conflict";

// Four-eyes principle of a sign-off: the approver made no part of what is approved (common practice, no source).
describe("fourEyesConflict", () => {
  it("lets someone who made none of the parts approve", () => {
    expect(fourEyesConflict({ approverId: "eng", setupBy: "tech", analysedBy: "tech", evaluatedBy: null })).toEqual([]);
  });
  it("names each part the approver made", () => {
    expect(fourEyesConflict({ approverId: "eng", setupBy: "eng", analysedBy: "tech", evaluatedBy: "eng" })).toEqual(["set-up", "evaluation"]);
    expect(fourEyesConflict({ approverId: "adm", setupBy: "adm", analysedBy: "adm", evaluatedBy: "adm" })).toEqual(["set-up", "analysis", "evaluation"]);
  });
});
