import type { Spectrum } from '../spectrum';
import { canberra } from './canberra';
import { assertSameGrid } from './same-grid';

/**
 * Ohmprint's spectral distance: the Canberra distance of the real parts plus that of the
 * imaginary parts, divided by the number of terms 2N, so it is dimensionless and lies in [0, 1].
 * Relative, so small and large impedances weigh alike. Both spectra must be on the same grid.
 */
export function spectrumDistance(a: Spectrum, b: Spectrum): number {
  assertSameGrid(a, b);
  const n = a.frequencyHz.length;
  return (canberra(a.re, b.re) + canberra(a.im, b.im)) / (2 * n);
}
