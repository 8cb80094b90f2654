import { gzipSync } from "node:zlib";
import type { ChartData } from "./chart-data";

/**
 * An evaluation's chart data as the charts route sends it to a client that accepts gzip: the JSON text,
 * gzipped once when the evaluation is stored (at the highest level: done once, read many times).
 * Text form is `JSON.stringify(charts)`, i.e. the same document as the `charts` column.
 *
 * @example gunzipSync(chartsGzip(charts)).toString() === JSON.stringify(charts)
 */
export function chartsGzip(charts: ChartData | string): Buffer {
  return gzipSync(typeof charts === "string" ? charts : JSON.stringify(charts), { level: 9 });
}
