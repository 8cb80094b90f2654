// A per-column setting (scale, quantity, sensor rating) must name a column of the file.
import type { CsvLayout } from "./detect-layout";
import { AnalysisInputError } from "./errors";
import { findOverride } from "./plan-columns";
import { parseHeader } from "./parse-header";

/**
 * Checks that every key of `overrides` names a column of the file — its header text or its name
 * without the unit, case-insensitively, as {@link findOverride} matches them. A setting for a
 * column that does not exist would otherwise be silently ignored (a CT ratio never applied).
 *
 * Complexity O(keys × columns).
 *
 * @throws AnalysisInputError "unknown-column" naming the keys that match nothing and listing the file's columns.
 * @example
 * checkOverrideColumns(detectLayout("t (s),Ia (A)\n0,1\n1e-4,2\n", true), { Ib: { scale: 40 } })
 * // throws: no column named "Ib"; the columns are "t (s)", "Ia (A)"
 */
export function checkOverrideColumns(layout: Pick<CsvLayout, "headers">, overrides: Record<string, unknown> | undefined): void {
  if (!overrides) return;
  const columns = layout.headers.map((cell) => parseHeader(cell));
  const unknown = Object.keys(overrides).filter((key) => !columns.some((c) => findOverride({ [key]: {} }, c.header, c.name)));
  if (unknown.length === 0) return;
  const names = unknown.map((k) => `"${k}"`).join(", ");
  throw new AnalysisInputError(
    "unknown-column",
    `no column named ${names}; the columns are ${columns.map((c) => `"${c.header}"`).join(", ")} (a column is named by its header or by its name without the unit)`,
  );
}
