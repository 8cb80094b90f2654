// A mapping that names a column the file does not have is a mistake to report, not to ignore.
import { open } from "node:fs/promises";
import { AnalysisInputError } from "@/lib/analysis/errors";
import { inspectCsv } from "@/lib/analysis/inspect-csv";
import type { CaptureMapping } from "@/lib/validations/capture";

const headBytes = 256 * 1024;

/**
 * Checks that every column the mapping names (by header, e.g. "Ia (A)", or name, e.g. "Ia",
 * case-insensitively — as the importer matches them) is in the file's header.
 * Reads at most the first 256 KB. A file whose head cannot be read as CSV is left to the
 * analysis, which reports that problem itself.
 *
 * @throws AnalysisInputError "invalid-option" naming the unknown column(s) and listing the file's columns.
 * @example
 * await checkMappingColumns("cap.csv", { channels: { Ib: { scale: 2 } } })
 * // throws: the mapping names a column the file does not have: "Ib"; the file's columns are: Time (s), Ia (A)
 */
export async function checkMappingColumns(path: string, mapping: Pick<CaptureMapping, "channels">): Promise<void> {
  const names = Object.keys(mapping.channels);
  if (names.length === 0) return;
  const handle = await open(path, "r");
  let text: string;
  try {
    const buffer = Buffer.alloc(headBytes);
    const { bytesRead } = await handle.read(buffer, 0, headBytes, 0);
    text = buffer.subarray(0, bytesRead).toString("utf8");
    if (bytesRead === headBytes) text = text.slice(0, Math.max(0, text.lastIndexOf("\n") + 1));
  } finally {
    await handle.close();
  }
  let columns: { header: string; name: string }[];
  try {
    columns = inspectCsv(text).columns;
  } catch {
    return;
  }
  const known = new Set(columns.flatMap((c) => [c.header.trim().toLowerCase(), c.name.trim().toLowerCase()]));
  const unknown = names.filter((n) => !known.has(n.trim().toLowerCase()));
  if (unknown.length === 0) return;
  throw new AnalysisInputError(
    "invalid-option",
    `the mapping names ${unknown.length === 1 ? "a column" : "columns"} the file does not have: ${unknown.map((n) => `"${n}"`).join(", ")}; the file's columns are: ${columns.map((c) => c.header).join(", ")}`,
  );
}
