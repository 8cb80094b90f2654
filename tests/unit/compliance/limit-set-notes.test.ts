// Interpretation choices are listed once, in plain words, in each seeded limit set's notes and on the
// sheet's notes; provenance markers stay on the rows and rules (limit-table screens, JSON export).
import { describe, expect, test } from "vitest";
import { LimitSetRevisionContentSchema } from "@/lib/compliance/model";
import { seedLimitSetInputs } from "@/lib/compliance/seed";

const MARKERS = ["from memory", "(confirmed)", "Ordwise choice", "common practice", "secondary source"];

describe("limit-set notes", () => {
  test.each(seedLimitSetInputs.map((s) => [s.content.key, s.content] as const))("%s has notes in plain words, each once", (_key, content) => {
    const parsed = LimitSetRevisionContentSchema.parse(content);
    expect(parsed.notes?.length ?? 0).toBeGreaterThan(0);
    for (const note of parsed.notes ?? []) for (const marker of MARKERS) expect(note).not.toContain(marker);
    expect(new Set(parsed.notes).size).toBe(parsed.notes!.length);
  });

  test("the IEEE 519 current sets state where h2 falls and how a value on an Isc/IL bound is read (IEEE Std 519-2014 Table 2 ranges start at h = 3)", () => {
    for (const key of ["ieee-519-2014-current", "ieee-519-2022-current"]) {
      const notes = seedLimitSetInputs.find((s) => s.content.key === key)!.content.notes!;
      expect(notes.some((n) => n.includes("Order 2") && n.includes("3 ≤ h < 11"))).toBe(true);
      expect(notes.some((n) => n.includes("uses the higher row"))).toBe(true);
    }
  });

  test("a notes entry must be text (the model refuses an empty one)", () => {
    const content = seedLimitSetInputs[0]!.content;
    expect(LimitSetRevisionContentSchema.safeParse({ ...content, notes: [""] }).success).toBe(false);
  });
});
