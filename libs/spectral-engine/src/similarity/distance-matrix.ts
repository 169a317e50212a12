import type { Spectrum } from '../spectrum';
import { assertFiniteValues } from '../statistics/finite-values';
import { canberraUnchecked } from './canberra';
import { assertSameGrid } from './same-grid';

/**
 * All pairwise `spectrumDistance` values (dimensionless, 0…1) as a symmetric n × n matrix with a
 * zero diagonal; every spectrum must be on the same grid. Checks each spectrum once, not per pair.
 */
export function distanceMatrix(spectra: readonly Spectrum[]): number[][] {
  const n = spectra.length;
  spectra.forEach((s, i) => {
    assertSameGrid(spectra[0], s, 'spectrum 1', `spectrum ${i + 1}`);
    assertFiniteValues(s.re, 're', `spectrum ${i + 1}`);
    assertFiniteValues(s.im, 'im', `spectrum ${i + 1}`);
  });
  const d = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  for (let i = 0; i < n; i++) {
    const a = spectra[i];
    const terms = 2 * a.re.length;
    for (let j = i + 1; j < n; j++) {
      const b = spectra[j];
      // Same sums in the same order as spectrumDistance, so the matrix agrees with it to the last bit.
      d[i][j] = d[j][i] = (canberraUnchecked(a.re, b.re) + canberraUnchecked(a.im, b.im)) / terms;
    }
  }
  return d;
}
