import type { SpectrumGrid } from "./interpolate-grid";
import { MAX_ORDER } from "./types";

/** A grid stored compactly: its axes and the re/im of orders 1..MAX_ORDER per point as Float32 in base64. */
export interface EncodedGrid {
  axes: number[][];
  data: string;
}

/**
 * Encodes a spectrum grid for the generated data file (Float32: ~7 significant digits, far below
 * the simulation's own accuracy).
 *
 * @example encodeGrid(grid).data.length
 */
export function encodeGrid(grid: SpectrumGrid): EncodedGrid {
  const values = new Float32Array(grid.re.length * MAX_ORDER * 2);
  let k = 0;
  for (let p = 0; p < grid.re.length; p++) {
    for (let h = 1; h <= MAX_ORDER; h++) {
      values[k++] = grid.re[p]![h]!;
      values[k++] = grid.im[p]![h]!;
    }
  }
  return { axes: grid.axes.map((a) => [...a]), data: Buffer.from(values.buffer).toString("base64") };
}
