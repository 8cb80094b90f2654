// The revision history's diff names each changed cell by band, row and field.
import { describe, expect, test } from "vitest";
import { diffRevisions } from "@/lib/compliance/diff-revisions";
import { getSeedLimitSet } from "@/lib/compliance/seed";

const classA = getSeedLimitSet("iec-61000-3-2-class-a")!.content;
const clone = <T>(v: T): T => structuredClone(v);

describe("diffRevisions", () => {
  test("identical content has no changes", () => {
    expect(diffRevisions(classA, clone(classA))).toEqual([]);
  });

  test("a changed cell names band, row (1-based, with its orders) and field", () => {
    const after = clone(classA);
    after.bands[0]!.orderRows[1]!.limit = 1.1;
    expect(diffRevisions(classA, after)).toEqual([
      { kind: "changed", location: "Band 'Class A', row 2 (h 5)", field: "limit", before: "1.14", after: "1.1" },
    ]);
  });

  test("switching a value to a formula reports both cells", () => {
    const after = clone(classA);
    const row = after.bands[0]!.orderRows[0]!;
    delete row.limit;
    row.formula = "2.3*3/h";
    const changes = diffRevisions(classA, after);
    expect(changes).toContainEqual({ kind: "removed", location: "Band 'Class A', row 1 (h 3)", field: "limit", before: "2.3", after: undefined });
    expect(changes).toContainEqual({ kind: "added", location: "Band 'Class A', row 1 (h 3)", field: "formula", before: undefined, after: "2.3*3/h" });
  });

  test("inserting a row reports one added row, not every later row changing", () => {
    const after = clone(classA);
    after.bands[0]!.orderRows.splice(0, 0, { from: 1, to: 1, parity: "all", limit: 16, basis: "A" });
    const changes = diffRevisions(classA, after);
    expect(changes).toHaveLength(1);
    expect(changes[0]).toMatchObject({ kind: "added", location: "Band 'Class A', row 1 (h 1)", field: "" });
  });

  test("removing a row reports it removed with its old orders", () => {
    const after = clone(classA);
    after.bands[0]!.orderRows.splice(6, 1);
    const changes = diffRevisions(classA, after);
    expect(changes).toHaveLength(1);
    expect(changes[0]).toMatchObject({ kind: "removed", location: "Band 'Class A', row 7 (h 15–39 odd)" });
  });

  test("an edited range pairs with the old row and shows from/to", () => {
    const after = clone(classA);
    after.bands[0]!.orderRows[6]!.to = 37;
    expect(diffRevisions(classA, after)).toEqual([
      { kind: "changed", location: "Band 'Class A', row 7 (h 15–37 odd)", field: "to", before: "39", after: "37" },
    ]);
  });

  test("aggregates pair by name; applicability and rules by path", () => {
    const after = clone(classA);
    after.bands[0]!.aggregates[0]!.role = "requirement";
    after.bands[0]!.applicability = { ratedPowerW: { min: 75, minInclusive: false, maxInclusive: false } };
    after.rules.threshold!.minimumA = 0.01;
    after.description = "changed";
    const changes = diffRevisions(classA, after);
    expect(changes).toContainEqual({ kind: "changed", location: "Band 'Class A', aggregate POHC", field: "role", before: "allowance-condition", after: "requirement" });
    expect(changes).toContainEqual({ kind: "added", location: "Band 'Class A'", field: "applicability.ratedPowerW.min", before: undefined, after: "75" });
    expect(changes).toContainEqual({ kind: "changed", location: "Rules", field: "threshold.minimumA", before: "0.005", after: "0.01" });
    expect(changes).toContainEqual(expect.objectContaining({ location: "Set", field: "description", after: "changed" }));
  });

  test("tolerates non-object input (an old revision is not re-validated)", () => {
    expect(diffRevisions(null, { bands: [] })).toEqual([]);
  });
});
