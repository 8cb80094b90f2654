// The import graph of the product's own TypeScript (lib/, app/, db/), read from the source text with
// TypeScript's pre-parser: every `import … from`, `export … from`, `import()` and `require()` with a relative or "@/"
// path, resolved as the bundler does (.ts, .tsx, /index.ts, /index.tsx). Type-only imports count: a type cycle
// is still a cycle for a reader.
import { existsSync, readdirSync, readFileSync, statSync } from "node:fs";
import path from "node:path";
import ts from "typescript";

export const ROOT = path.resolve(__dirname, "../../..");
const SOURCE = /\.tsx?$/;

function sourceFiles(dir: string): string[] {
  const out: string[] = [];
  for (const name of readdirSync(dir)) {
    const full = path.join(dir, name);
    if (statSync(full).isDirectory()) out.push(...sourceFiles(full));
    else if (SOURCE.test(name) && !name.endsWith(".d.ts")) out.push(full);
  }
  return out;
}

/** Every module specifier one source text names (static, re-export, dynamic import and require), by TypeScript's own pre-parser. */
export function specifiersOf(source: string): string[] {
  return ts.preProcessFile(source, true, true).importedFiles.map((f) => f.fileName);
}

/** The file a relative or "@/" specifier names, or null for a package (bare) specifier or a non-source file. */
export function resolveSpecifier(fromFile: string, specifier: string): string | null {
  let base: string;
  if (specifier.startsWith("@/")) base = path.join(ROOT, specifier.slice(2));
  else if (specifier.startsWith("./") || specifier.startsWith("../")) base = path.resolve(path.dirname(fromFile), specifier);
  else return null;
  for (const candidate of [base, `${base}.ts`, `${base}.tsx`, path.join(base, "index.ts"), path.join(base, "index.tsx")]) {
    if (SOURCE.test(candidate) && existsSync(candidate) && statSync(candidate).isFile()) return candidate;
  }
  return null;
}

export interface ImportGraph {
  /** Repository-relative path → the repository-relative paths it imports. */
  edges: Map<string, string[]>;
  /** Repository-relative path → the package specifiers it imports ("react", "next/server", "@aws-sdk/client-s3"). */
  packages: Map<string, string[]>;
}

export function importGraph(dirs: string[] = ["lib", "app", "db"]): ImportGraph {
  const edges = new Map<string, string[]>();
  const packages = new Map<string, string[]>();
  for (const dir of dirs) {
    for (const file of sourceFiles(path.join(ROOT, dir))) {
      const rel = path.relative(ROOT, file);
      const local: string[] = [];
      const bare: string[] = [];
      for (const spec of specifiersOf(readFileSync(file, "utf8"))) {
        const target = resolveSpecifier(file, spec);
        if (target) local.push(path.relative(ROOT, target));
        else if (!spec.startsWith(".") && !spec.startsWith("@/")) bare.push(spec);
      }
      edges.set(rel, [...new Set(local)]);
      packages.set(rel, [...new Set(bare)]);
    }
  }
  return { edges, packages };
}

/** The strongly connected components with more than one file, or one file importing itself (Tarjan's algorithm). */
export function cycles(edges: Map<string, string[]>): string[][] {
  let index = 0;
  const order = new Map<string, number>();
  const low = new Map<string, number>();
  const stack: string[] = [];
  const onStack = new Set<string>();
  const found: string[][] = [];
  const connect = (v: string): void => {
    order.set(v, index);
    low.set(v, index);
    index++;
    stack.push(v);
    onStack.add(v);
    for (const w of edges.get(v) ?? []) {
      if (!order.has(w)) {
        connect(w);
        low.set(v, Math.min(low.get(v)!, low.get(w)!));
      } else if (onStack.has(w)) low.set(v, Math.min(low.get(v)!, order.get(w)!));
    }
    if (low.get(v) === order.get(v)) {
      const component: string[] = [];
      let w: string;
      do {
        w = stack.pop()!;
        onStack.delete(w);
        component.push(w);
      } while (w !== v);
      if (component.length > 1 || (edges.get(v) ?? []).includes(v)) found.push(component.sort());
    }
  };
  for (const v of edges.keys()) if (!order.has(v)) connect(v);
  return found;
}
