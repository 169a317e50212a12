import type { Spectrum } from '../spectrum';

/** Largest number of library spectra sampled to rank the terms; enough to rank, cheap at any size. */
const SAMPLE_SIZE = 512;

/**
 * Orders the 2N Canberra terms (0…N−1 the real parts, N…2N−1 the imaginary parts) so the terms
 * that separate library spectra most come first: partial sums then pass the current k-th best
 * distance after few terms, and the first block acts as a set of sentinel frequencies. The order
 * only speeds the search; results do not depend on it.
 */
export function rankTermsBySpread(spectra: readonly Spectrum[]): Int32Array {
  const n = spectra[0].re.length;
  const spread = new Float64Array(2 * n);
  const step = Math.max(1, Math.floor(spectra.length / SAMPLE_SIZE));
  const add = (offset: number, x: Float64Array, y: Float64Array) => {
    for (let t = 0; t < n; t++) {
      const den = Math.abs(x[t]) + Math.abs(y[t]);
      if (den > 0) spread[offset + t] += Math.abs(x[t] - y[t]) / den;
    }
  };
  for (let r = 0; r + step < spectra.length; r += step) {
    add(0, spectra[r].re, spectra[r + step].re);
    add(n, spectra[r].im, spectra[r + step].im);
  }
  const order = Array.from({ length: 2 * n }, (_, t) => t);
  order.sort((s, t) => spread[t] - spread[s] || s - t);
  return Int32Array.from(order);
}
