import type { SpectrumGrid } from "./interpolate-grid";
import { MAX_ORDER } from "./types";

/** The stored grid when its axes equal `axes`, else null (the caller simulates). */
export function decodeGrid(stored: { axes: number[][]; data: string } | undefined, axes: readonly (readonly number[])[]): SpectrumGrid | null {
  if (!stored || JSON.stringify(stored.axes) !== JSON.stringify(axes.map((a) => [...a]))) return null;
  const bytes = Buffer.from(stored.data, "base64");
  const values = new Float32Array(bytes.buffer, bytes.byteOffset, bytes.byteLength / 4);
  const points = values.length / (MAX_ORDER * 2);
  const re: Float64Array[] = [];
  const im: Float64Array[] = [];
  let k = 0;
  for (let p = 0; p < points; p++) {
    const r = new Float64Array(MAX_ORDER + 1);
    const i = new Float64Array(MAX_ORDER + 1);
    for (let h = 1; h <= MAX_ORDER; h++) {
      r[h] = values[k++]!;
      i[h] = values[k++]!;
    }
    re.push(r);
    im.push(i);
  }
  return { axes, re, im };
}
