// No import cycles in the product's code (lib/, app/, db/): a module that imports, directly or through others,
// a module that imports it back cannot be read, tested or moved on its own, and its load order is fragile.
// Type-only imports count too (common practice, no source).
import { describe, expect, test } from "vitest";
import { cycles, importGraph, resolveSpecifier, ROOT, specifiersOf } from "./import-graph";

describe("the import-graph reader", () => {
  test("finds a cycle of three and a self-import, and no cycle in a chain", () => {
    const graph = new Map([
      ["a", ["b"]],
      ["b", ["c"]],
      ["c", ["a", "d"]],
      ["d", []],
      ["e", ["e"]],
      ["f", ["d"]],
    ]);
    expect(cycles(graph)).toEqual([["a", "b", "c"], ["e"]]);
    expect(cycles(new Map([["x", ["y"]], ["y", ["z"]], ["z", []]]))).toEqual([]);
  });

  test("reads static, type-only, re-export and dynamic imports", () => {
    const source = [
      'import { a } from "./a";',
      'import type { B } from "@/lib/b";',
      'export { c } from "../c";',
      'const d = await import("./d");',
      'import "server-only";',
    ].join("\n");
    expect(specifiersOf(source)).toEqual(["./a", "@/lib/b", "../c", "./d", "server-only"]);
  });

  test('resolves "@/" and relative paths to files, and leaves packages out', () => {
    const from = `${ROOT}/lib/analysis/analyze-csv-file.ts`;
    expect(resolveSpecifier(from, "./line-fit")).toBe(`${ROOT}/lib/analysis/line-fit.ts`);
    expect(resolveSpecifier(from, "@/lib/errors")).toBe(`${ROOT}/lib/errors.ts`);
    expect(resolveSpecifier(from, "zod")).toBeNull();
  });
});

test("no module under lib/, app/ or db/ imports itself back through others", () => {
  const { edges } = importGraph();
  // The graph is read at all: the streaming analysis imports its two passes.
  expect(edges.get("lib/analysis/analyze-csv-file.ts")).toContain("lib/analysis/stream-first-pass.ts");
  expect(cycles(edges)).toEqual([]);
}, 60_000);
