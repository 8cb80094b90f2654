// The computation modules stay pure: they run the same in the web app, the CLI and the tests, so nothing they
// import — directly or through other modules of the repository — may reach the framework (next, react), the
// database (db/) or the object store (@aws-sdk). Product rule of this repository (common practice, no source).
import { expect, test } from "vitest";
import { importGraph } from "./import-graph";

const PURE = ["lib/analysis/", "lib/compliance/", "lib/pipeline/", "lib/frontends/", "lib/mitigation/", "lib/intervals/"];
/** lib/pipeline files that run a stored job and so reach the database on purpose (none today). */
const PIPELINE_WITH_DB = new Set<string>([]);
const FORBIDDEN_PACKAGE = /^(next|react|react-dom|server-only)(\/|$)|^@aws-sdk\//;

test("pure modules reach no framework, database or object store, directly or through other modules", () => {
  const { edges, packages } = importGraph();
  const problems: string[] = [];
  const pure = [...edges.keys()].filter((f) => PURE.some((dir) => f.startsWith(dir)) && !PIPELINE_WITH_DB.has(f));
  expect(pure.length).toBeGreaterThan(50);
  for (const start of pure) {
    // Breadth-first over the repository's own modules, keeping the path for the message.
    const via = new Map<string, string>([[start, ""]]);
    const queue = [start];
    while (queue.length > 0) {
      const file = queue.shift()!;
      const path = via.get(file) ? `${via.get(file)} → ${file}` : file;
      if (file.startsWith("db/")) problems.push(`${path} (database)`);
      for (const pkg of packages.get(file) ?? []) if (FORBIDDEN_PACKAGE.test(pkg)) problems.push(`${path} → ${pkg}`);
      for (const next of edges.get(file) ?? []) {
        if (!via.has(next)) {
          via.set(next, path);
          queue.push(next);
        }
      }
    }
  }
  expect([...new Set(problems)]).toEqual([]);
}, 60_000);
