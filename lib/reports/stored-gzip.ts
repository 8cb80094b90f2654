import { gzipSync } from "node:zlib";

/**
 * A JSON answer as stored to be sent as it is to a client that accepts gzip (chart data, sheet bodies):
 * the JSON text (`JSON.stringify(value)`, or `value` itself when it is already that text) gzipped once,
 * at the highest level — done once when stored, read many times.
 *
 * @example gunzipSync(storedGzip(charts)).toString() === JSON.stringify(charts)
 */
export function storedGzip(value: unknown): Buffer {
  return gzipSync(typeof value === "string" ? value : JSON.stringify(value), { level: 9 });
}
