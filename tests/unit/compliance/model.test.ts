// The limit-set schema rejects malformed revision content with messages an admin can act on.
import { describe, expect, test } from "vitest";
import { LimitSetRevisionContentSchema, type LimitSetRevisionContentInput } from "@/lib/compliance/model";
import { orderMatchesParity } from "@/lib/compliance/order-matches-parity";
import { describeRange } from "@/lib/compliance/select-band";

function content(bands: LimitSetRevisionContentInput["bands"]): LimitSetRevisionContentInput {
  return {
    key: "test-set",
    standard: "Test",
    edition: "1",
    scope: "test",
    description: "test",
    quantity: "current",
    appliesTo: "tests",
    bands,
  };
}

function issues(input: LimitSetRevisionContentInput): string {
  const result = LimitSetRevisionContentSchema.safeParse(input);
  return result.success ? "" : result.error.issues.map((issue) => issue.message).join(" | ");
}

describe("LimitSetRevisionContentSchema", () => {
  test("accepts a minimal set and applies defaults (parity all, ≤ passes, no conditions)", () => {
    const parsed = LimitSetRevisionContentSchema.parse(content([{ label: "only", orderRows: [{ from: 3, to: 3, limit: 1, basis: "A" }] }]));
    expect(parsed.bands[0]?.orderRows[0]?.parity).toBe("all");
    expect(parsed.rules.comparison.passAtLimit).toBe(true);
    expect(parsed.bands[0]?.conditions).toEqual([]);
  });

  test("rejects a formula with an unknown identifier, naming the position", () => {
    expect(issues(content([{ label: "b", orderRows: [{ from: 15, to: 39, formula: "0.15*15/n", basis: "A" }] }]))).toContain(
      'unknown identifier "n" (allowed: h, P, lambda) at position 9',
    );
  });

  test("rejects a row with both limit and formula, or neither", () => {
    expect(issues(content([{ label: "b", orderRows: [{ from: 3, to: 3, limit: 1, formula: "1", basis: "A" }] }]))).toContain("exactly one of limit or formula");
    expect(issues(content([{ label: "b", orderRows: [{ from: 3, to: 3, basis: "A" }] }]))).toContain("exactly one of limit or formula");
  });

  test("rejects overlapping rows in a band (order covered twice)", () => {
    const message = issues(
      content([
        {
          label: "b",
          orderRows: [
            { from: 3, to: 9, parity: "odd", limit: 1, basis: "A" },
            { from: 9, to: 9, limit: 2, basis: "A" },
          ],
        },
      ]),
    );
    expect(message).toContain("order 9 is covered by rows 0 and 1");
  });

  test("rejects an aggregate formula using h, duplicate band labels, a bad key and an exempt band with limits", () => {
    expect(issues(content([{ label: "b", aggregates: [{ name: "THC", from: 2, to: 40, basis: "A", formula: "h*2" }] }]))).toContain("may not use h");
    expect(issues(content([{ label: "same" }, { label: "same" }]))).toContain('duplicate band label "same"');
    expect(issues({ ...content([{ label: "b" }]), key: "Not Kebab" })).toContain("kebab-case");
    expect(issues(content([{ label: "b", exempt: true, orderRows: [{ from: 3, to: 3, limit: 1, basis: "A" }] }]))).toContain("must not have limits");
  });

  test("rejects an unknown basis", () => {
    expect(issues(content([{ label: "b", orderRows: [{ from: 3, to: 3, limit: 1, basis: "%X" as "A" }] }]))).not.toBe("");
  });
});

describe("orderMatchesParity", () => {
  test.each([
    [9, "odd", true],
    [9, "triplen", true],
    [6, "triplen", false], // triplen = odd multiples of 3 (power-system usage, common practice)
    [9, "non-triplen-odd", false],
    [11, "non-triplen-odd", true],
    [4, "even", true],
    [4, "all", true],
  ] as const)("%d is %s: %s", (order, parity, expected) => {
    expect(orderMatchesParity(order, parity)).toBe(expected);
  });
});

test("describeRange words a band bound as printed", () => {
  expect(describeRange({ min: 50, max: 100, minInclusive: true, maxInclusive: false }, "Isc/IL")).toBe("50 ≤ Isc/IL < 100");
  expect(describeRange({ min: 1000, minInclusive: false, maxInclusive: false }, "bus voltage", " V")).toBe("1000 V < bus voltage");
});
