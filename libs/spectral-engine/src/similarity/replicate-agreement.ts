import type { Spectrum } from '../spectrum';
import { distanceMatrix } from './distance-matrix';

/** How closely replicate measurements of one sample agree. */
export interface ReplicateAgreement {
  /** Mean of the pairwise spectral distances (dimensionless, 0…1). */
  readonly meanDistance: number;
  /** Largest pairwise spectral distance (dimensionless, 0…1). */
  readonly maxDistance: number;
  /** The pair (zero-based replicate positions) that disagree most. */
  readonly worstPair: readonly [number, number];
  readonly pairCount: number;
}

/** Replicate agreement: mean and largest pairwise `spectrumDistance` of at least two replicates on one grid. */
export function replicateAgreement(spectra: readonly Spectrum[]): ReplicateAgreement {
  if (spectra.length < 2) throw new RangeError(`replicate agreement needs at least two replicates, got ${spectra.length}`);
  const d = distanceMatrix(spectra);
  let sum = 0;
  let max = -1;
  let worstPair: [number, number] = [0, 1];
  for (let i = 0; i < spectra.length; i++) {
    for (let j = i + 1; j < spectra.length; j++) {
      sum += d[i][j];
      if (d[i][j] > max) {
        max = d[i][j];
        worstPair = [i, j];
      }
    }
  }
  const pairCount = (spectra.length * (spectra.length - 1)) / 2;
  return { meanDistance: sum / pairCount, maxDistance: max, worstPair, pairCount };
}
