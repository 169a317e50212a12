import type { ReferenceBand, SpectrumSeries } from './chart-types';
import { quantileSorted } from './quantile';
import { modulus, phaseDeg } from './spectrum-polar';

/** How wide the shaded band is: the full range of the lots, or a central percentile interval. */
export type BandSpread =
  | { readonly kind: 'range' }
  | { readonly kind: 'percentile'; readonly lowerPercent: number; readonly upperPercent: number };

/**
 * The envelope of a reference library's spectra, frequency by frequency. All spectra must already
 * sit on the same grid (the method's resampling grid); mixing grids would compare different
 * frequencies, so it is refused.
 */
export function referenceEnvelope(
  lots: readonly SpectrumSeries[],
  spread: BandSpread,
  label: string,
): ReferenceBand {
  if (lots.length === 0) throw new RangeError('a reference band needs at least one lot');
  const grid = lots[0].frequencyHz;
  const n = grid.length;
  lots.forEach((lot, index) => {
    if (lot.frequencyHz.length !== n || lot.re.length !== n || lot.im.length !== n) {
      throw new RangeError(`lot ${index + 1} ("${lot.label}") has ${lot.frequencyHz.length} points; the grid has ${n}`);
    }
    for (let i = 0; i < n; i++) {
      if (lot.frequencyHz[i] !== grid[i]) {
        throw new RangeError(`lot ${index + 1} ("${lot.label}") is not on the shared grid at point ${i + 1}`);
      }
    }
  });
  const [pLow, pHigh] =
    spread.kind === 'range' ? [0, 1] : [spread.lowerPercent / 100, spread.upperPercent / 100];
  if (!(pLow <= pHigh)) throw new RangeError('the lower percentile must not exceed the upper one');

  const out = {
    reLow: new Float64Array(n), reHigh: new Float64Array(n),
    imLow: new Float64Array(n), imHigh: new Float64Array(n),
    modulusLow: new Float64Array(n), modulusHigh: new Float64Array(n),
    phaseLowDeg: new Float64Array(n), phaseHighDeg: new Float64Array(n),
  };
  const column = new Float64Array(lots.length);
  const fill = (value: (lot: SpectrumSeries, i: number) => number, i: number, low: Float64Array, high: Float64Array) => {
    lots.forEach((lot, k) => (column[k] = value(lot, i)));
    column.sort();
    low[i] = quantileSorted(column, pLow);
    high[i] = quantileSorted(column, pHigh);
  };
  for (let i = 0; i < n; i++) {
    fill((lot, j) => lot.re[j], i, out.reLow, out.reHigh);
    fill((lot, j) => lot.im[j], i, out.imLow, out.imHigh);
    fill((lot, j) => modulus(lot.re[j], lot.im[j]), i, out.modulusLow, out.modulusHigh);
    fill((lot, j) => phaseDeg(lot.re[j], lot.im[j]), i, out.phaseLowDeg, out.phaseHighDeg);
  }
  return { label, frequencyHz: Float64Array.from(grid), ...out };
}
