import { MAX_ORDER } from "./types";

/** Spectra precomputed on a rectangular parameter grid, stored as complex coefficients. */
export interface SpectrumGrid {
  axes: readonly (readonly number[])[];
  /** Per grid point (row-major, last axis fastest): re and im of orders 0..MAX_ORDER, relative to the fundamental's magnitude. */
  re: Float64Array[];
  im: Float64Array[];
}

function locate(axis: readonly number[], x: number): [number, number] {
  if (axis.length === 1) return [0, 0];
  const clamped = Math.min(Math.max(x, axis[0]!), axis[axis.length - 1]!);
  let k = 0;
  while (k < axis.length - 2 && clamped > axis[k + 1]!) k++;
  const t = (clamped - axis[k]!) / (axis[k + 1]! - axis[k]!);
  return [k, t];
}

/**
 * Multilinear interpolation of a spectrum grid at a parameter point (clamped to the grid), on the
 * complex coefficients so phases interpolate without wrapping. O(2^dims · MAX_ORDER).
 *
 * @returns re and im per order (index = order), relative to the fundamental's magnitude
 * @example interpolateGrid(grid, [3, 0, 100])
 */
export function interpolateGrid(grid: SpectrumGrid, point: readonly number[]): { re: Float64Array; im: Float64Array } {
  const dims = grid.axes.length;
  const loc = grid.axes.map((axis, d) => locate(axis, point[d]!));
  const strides: number[] = new Array(dims).fill(1);
  for (let d = dims - 2; d >= 0; d--) strides[d] = strides[d + 1]! * grid.axes[d + 1]!.length;
  const re = new Float64Array(MAX_ORDER + 1);
  const im = new Float64Array(MAX_ORDER + 1);
  for (let corner = 0; corner < 1 << dims; corner++) {
    let w = 1;
    let index = 0;
    for (let d = 0; d < dims; d++) {
      const [k, t] = loc[d]!;
      const up = (corner >> d) & 1;
      if (up && grid.axes[d]!.length === 1) {
        w = 0;
        break;
      }
      w *= up ? t : 1 - t;
      index += (k + up) * strides[d]!;
    }
    if (w === 0) continue;
    const gr = grid.re[index]!;
    const gi = grid.im[index]!;
    for (let h = 1; h <= MAX_ORDER; h++) {
      re[h] = re[h]! + w * gr[h]!;
      im[h] = im[h]! + w * gi[h]!;
    }
  }
  return { re, im };
}
