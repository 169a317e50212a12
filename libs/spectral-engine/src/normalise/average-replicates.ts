import type { Spectrum } from '../spectrum';

/**
 * Point-by-point mean of replicate spectra measured on the same frequencies (Hz), real and
 * imaginary parts averaged separately (Ω).
 * @throws RangeError when there are no spectra or their frequencies differ
 */
export function averageReplicates(spectra: readonly Spectrum[]): Spectrum {
  if (spectra.length === 0) throw new RangeError('no replicates to average');
  const first = spectra[0];
  const n = first.frequencyHz.length;
  const re = new Float64Array(n);
  const im = new Float64Array(n);
  spectra.forEach((s, r) => {
    if (s.frequencyHz.length !== n) {
      throw new RangeError(`replicate ${r + 1} has ${s.frequencyHz.length} frequencies, replicate 1 has ${n}: resample them onto one grid first`);
    }
    for (let i = 0; i < n; i++) {
      if (Math.abs(s.frequencyHz[i] - first.frequencyHz[i]) > 1e-9 * first.frequencyHz[i]) {
        throw new RangeError(`replicate ${r + 1} differs from replicate 1 at point ${i + 1} (${s.frequencyHz[i]} Hz vs ${first.frequencyHz[i]} Hz): resample them onto one grid first`);
      }
      re[i] += s.re[i];
      im[i] += s.im[i];
    }
  });
  for (let i = 0; i < n; i++) {
    re[i] /= spectra.length;
    im[i] /= spectra.length;
  }
  return { frequencyHz: Float64Array.from(first.frequencyHz), re, im };
}
