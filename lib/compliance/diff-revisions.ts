// What changed between two revisions of a limit set, cell by cell, for the revision history.
import type { Parity } from "./model";

/** One changed cell: where (band/row or section), which field, and the old and new text. */
export interface RevisionChange {
  kind: "changed" | "added" | "removed";
  /** e.g. `Band 'Class A', row 2 (h 5)`, `Band 'Class A', aggregate POHC`, `Rules`, `Set`. */
  location: string;
  /** Dotted field path inside the location, e.g. `limit`, `applicability.iscOverIl.max`; "" for a whole row. */
  field: string;
  before?: string;
  after?: string;
}

type Json = unknown;
type Obj = Record<string, Json>;

const isObject = (v: Json): v is Obj => v !== null && typeof v === "object" && !Array.isArray(v);
const asArray = (v: Json): Json[] => (Array.isArray(v) ? v : []);

function show(value: Json): string | undefined {
  if (value === undefined) return undefined;
  if (typeof value === "string") return value;
  return JSON.stringify(value);
}

/** Leaf-by-leaf differences of two JSON values; arrays of scalars compare as one cell. */
function diffValues(before: Json, after: Json, location: string, field: string, out: RevisionChange[]): void {
  // An object on one side only is compared with {} so each of its cells is listed.
  if ((isObject(before) || before === undefined) && (isObject(after) || after === undefined) && before !== after) {
    before = before ?? {};
    after = after ?? {};
  }
  if (isObject(before) && isObject(after)) {
    const keys = [...new Set([...Object.keys(before), ...Object.keys(after)])];
    for (const k of keys) diffValues(before[k], after[k], location, field ? `${field}.${k}` : k, out);
    return;
  }
  if (Array.isArray(before) && Array.isArray(after) && [...before, ...after].some((v) => isObject(v) || Array.isArray(v))) {
    for (let i = 0; i < Math.max(before.length, after.length); i += 1) {
      diffValues(before[i], after[i], location, `${field}[${i + 1}]`, out);
    }
    return;
  }
  if (JSON.stringify(before) === JSON.stringify(after)) return;
  const kind = before === undefined ? "added" : after === undefined ? "removed" : "changed";
  out.push({ kind, location, field, before: show(before), after: show(after) });
}

function rowOrders(row: Json): string {
  if (!isObject(row)) return "";
  const parity = (row.parity ?? "all") as Parity;
  if (row.from === row.to) return `h ${String(row.from)}`;
  return `h ${String(row.from)}–${String(row.to)}${parity === "all" ? "" : ` ${parity}`}`;
}

const rowKey = (row: Json): string => (isObject(row) ? `${String(row.from)}|${String(row.to)}|${String(row.parity ?? "all")}` : "");

/**
 * Pairs the items of two lists by a key (so a reordered or inserted row is not reported as
 * every later row changing); leftovers are paired in order (an edited range), then added/removed.
 */
function pairBy(before: Json[], after: Json[], key: (v: Json) => string): Array<[number | null, number | null]> {
  const pairs: Array<[number | null, number | null]> = [];
  const usedBefore = new Set<number>();
  const usedAfter = new Set<number>();
  after.forEach((a, j) => {
    const i = before.findIndex((b, k) => !usedBefore.has(k) && key(b) === key(a));
    if (i >= 0) {
      usedBefore.add(i);
      usedAfter.add(j);
      pairs.push([i, j]);
    }
  });
  const leftBefore = before.map((_, i) => i).filter((i) => !usedBefore.has(i));
  const leftAfter = after.map((_, j) => j).filter((j) => !usedAfter.has(j));
  const n = Math.min(leftBefore.length, leftAfter.length);
  for (let k = 0; k < n; k += 1) pairs.push([leftBefore[k]!, leftAfter[k]!]);
  for (const i of leftBefore.slice(n)) pairs.push([i, null]);
  for (const j of leftAfter.slice(n)) pairs.push([null, j]);
  // Report in the order of the newer revision, removed items last.
  return pairs.sort((p, q) => (p[1] ?? Infinity) - (q[1] ?? Infinity) || (p[0] ?? 0) - (q[0] ?? 0));
}

function diffList(
  before: Json[],
  after: Json[],
  key: (v: Json) => string,
  name: (v: Json, index: number) => string,
  out: RevisionChange[],
): void {
  for (const [i, j] of pairBy(before, after, key)) {
    const b = i === null ? undefined : before[i];
    const a = j === null ? undefined : after[j];
    if (i === null || j === null) {
      out.push({ kind: i === null ? "added" : "removed", location: i === null ? name(a, j!) : name(b, i), field: "", before: show(b), after: show(a) });
    } else {
      diffValues(b, a, name(a, j), "", out);
    }
  }
}

/**
 * The cell-level differences from revision `before` to revision `after` of a limit set's
 * content. Bands pair by label, order rows by their order range and parity, aggregates by
 * name, so inserting a row reports one added row. Accepts any JSON (old revisions are not
 * re-validated). O(n²) in the number of rows of a band, which is at most a few dozen.
 *
 * @example
 * diffRevisions(
 *   { bands: [{ label: "Class A", orderRows: [{ from: 3, to: 3, limit: 2.3, basis: "A" }] }] },
 *   { bands: [{ label: "Class A", orderRows: [{ from: 3, to: 3, limit: 2.2, basis: "A" }] }] },
 * )
 * // [{ kind: "changed", location: "Band 'Class A', row 1 (h 3)", field: "limit", before: "2.3", after: "2.2" }]
 */
export function diffRevisions(before: Json, after: Json): RevisionChange[] {
  const out: RevisionChange[] = [];
  const b = isObject(before) ? before : {};
  const a = isObject(after) ? after : {};
  const { bands: bandsBefore, rules: rulesBefore, ...metaBefore } = b;
  const { bands: bandsAfter, rules: rulesAfter, ...metaAfter } = a;
  diffValues(metaBefore, metaAfter, "Set", "", out);

  const bandName = (band: Json, index: number) =>
    isObject(band) && typeof band.label === "string" ? `Band '${band.label}'` : `Band ${index + 1}`;
  for (const [i, j] of pairBy(asArray(bandsBefore), asArray(bandsAfter), (v) => (isObject(v) ? String(v.label) : ""))) {
    const bandB = i === null ? undefined : asArray(bandsBefore)[i];
    const bandA = j === null ? undefined : asArray(bandsAfter)[j];
    if (i === null || j === null) {
      const band = bandA ?? bandB;
      out.push({ kind: i === null ? "added" : "removed", location: bandName(band, (j ?? i)!), field: "", before: show(bandB), after: show(bandA) });
      continue;
    }
    const where = bandName(bandA, j);
    const ob = isObject(bandB) ? bandB : {};
    const oa = isObject(bandA) ? bandA : {};
    const { orderRows: rowsB, aggregates: aggB, ...restB } = ob;
    const { orderRows: rowsA, aggregates: aggA, ...restA } = oa;
    diffValues(restB, restA, where, "", out);
    diffList(asArray(rowsB), asArray(rowsA), rowKey, (row, k) => `${where}, row ${k + 1} (${rowOrders(row)})`, out);
    diffList(
      asArray(aggB),
      asArray(aggA),
      (v) => (isObject(v) ? String(v.name) : ""),
      (agg, k) => `${where}, aggregate ${isObject(agg) ? String(agg.name) : k + 1}`,
      out,
    );
  }
  diffValues(rulesBefore, rulesAfter, "Rules", "", out);
  return out;
}
