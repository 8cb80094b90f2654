import { MAX_ORDER, type FrontEndSpectrum } from "./types";

const tables = new Map<number, { cos: Float64Array; sin: Float64Array }>();

function trigTable(n: number): { cos: Float64Array; sin: Float64Array } {
  let t = tables.get(n);
  if (!t) {
    t = { cos: new Float64Array(n), sin: new Float64Array(n) };
    for (let k = 0; k < n; k++) {
      t.cos[k] = Math.cos((2 * Math.PI * k) / n);
      t.sin[k] = Math.sin((2 * Math.PI * k) / n);
    }
    tables.set(n, t);
  }
  return t;
}

/**
 * Spectrum of one period of a current sampled at N equally spaced angles θ_k = θ0 + 2πk/N of the
 * supply voltage e = cos θ (voltage phase 0 at θ = 0). A direct DFT (kernel e^(−jhθ)), so any N
 * works: O(N · MAX_ORDER).
 *
 * Why not fft.js: the models sample on a grid fixed by their integrator step, not a power of two,
 * and only 50 orders are needed.
 *
 * @param samples one period of current (any unit), N ≥ 2·MAX_ORDER + 2
 * @param theta0Rad supply angle θ of samples[0], radians
 * @returns magnitudes relative to the fundamental and phases relative to the voltage (radians)
 * @example spectrumOfCycle(Array.from({ length: 256 }, (_, k) => Math.cos((2 * Math.PI * k) / 256)), 0).magnitude[1] // 1
 */
export function spectrumOfCycle(samples: ArrayLike<number>, theta0Rad: number): FrontEndSpectrum {
  const n = samples.length;
  if (n < 2 * MAX_ORDER + 2) throw new Error(`spectrumOfCycle needs at least ${2 * MAX_ORDER + 2} samples per cycle`);
  const { cos, sin } = trigTable(n);
  const re = new Float64Array(MAX_ORDER + 1);
  const im = new Float64Array(MAX_ORDER + 1);
  for (let h = 1; h <= MAX_ORDER; h++) {
    let sr = 0;
    let si = 0;
    let idx = 0;
    for (let k = 0; k < n; k++) {
      const x = samples[k]!;
      sr += x * cos[idx]!;
      si -= x * sin[idx]!;
      idx += h;
      if (idx >= n) idx -= n;
    }
    // Shift the time origin to θ = 0: multiply by e^(jhθ0).
    const c = Math.cos(h * theta0Rad);
    const s = Math.sin(h * theta0Rad);
    re[h] = sr * c - si * s;
    im[h] = sr * s + si * c;
  }
  const fundamental = Math.hypot(re[1]!, im[1]!);
  const magnitude = new Float64Array(MAX_ORDER + 1);
  const phaseRad = new Float64Array(MAX_ORDER + 1);
  for (let h = 1; h <= MAX_ORDER; h++) {
    magnitude[h] = fundamental > 0 ? Math.hypot(re[h]!, im[h]!) / fundamental : 0;
    phaseRad[h] = Math.atan2(im[h]!, re[h]!);
  }
  return { magnitude, phaseRad };
}
