import type { Spectrum } from '../spectrum';
import { spectrumDistance } from './spectrum-distance';

/**
 * All pairwise `spectrumDistance` values (dimensionless, 0…1) as a symmetric n × n matrix with a
 * zero diagonal; every spectrum must be on the same grid.
 */
export function distanceMatrix(spectra: readonly Spectrum[]): number[][] {
  const n = spectra.length;
  const d = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  for (let i = 0; i < n; i++) {
    for (let j = i + 1; j < n; j++) {
      try {
        d[i][j] = d[j][i] = spectrumDistance(spectra[i], spectra[j]);
      } catch (error) {
        throw new RangeError(`spectra ${i + 1} and ${j + 1}: ${(error as Error).message}`);
      }
    }
  }
  return d;
}
