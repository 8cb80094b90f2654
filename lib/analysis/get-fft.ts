// One fft.js instance (and its twiddle table) per transform size, reused across windows and calls.
import FFT from "fft.js";

const cache = new Map<number, FFT>();

/**
 * Returns a cached fft.js instance for `size` (a power of two ≥ 2).
 * fft.js: unnormalised forward kernel e^(−2πikn/N), interleaved [re, im] output; `realTransform`
 * fills bins 0..N/2.
 *
 * @example
 * const fft = getFft(4096); const out = new Float64Array(8192); fft.realTransform(out, samples);
 */
export function getFft(size: number): FFT {
  let fft = cache.get(size);
  if (!fft) {
    fft = new FFT(size);
    cache.set(size, fft);
  }
  return fft;
}
