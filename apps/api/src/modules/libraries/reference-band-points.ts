import type { ReferenceBandPoints } from '@ohmprint/contracts';

/**
 * The full range of the lots at each grid frequency: Z′, Z″, |Z| and phase (degrees, atan2 of
 * Z″ over Z′), each taken lot by lot, since the range of |Z| is not a function of the ranges of
 * its parts. One pass over the lots, O(lots × grid).
 */
export function computeReferenceBand(spectra: readonly { re: ArrayLike<number>; im: ArrayLike<number> }[], grid: ArrayLike<number>): ReferenceBandPoints {
  const n = grid.length;
  const low = () => new Array<number>(n).fill(Infinity);
  const high = () => new Array<number>(n).fill(-Infinity);
  const b = { reLow: low(), reHigh: high(), imLow: low(), imHigh: high(), modulusLow: low(), modulusHigh: high(), phaseLowDeg: low(), phaseHighDeg: high() };
  for (const s of spectra) {
    for (let i = 0; i < n; i++) {
      const re = s.re[i];
      const im = s.im[i];
      const m = Math.hypot(re, im);
      const p = (Math.atan2(im, re) * 180) / Math.PI;
      if (re < b.reLow[i]) b.reLow[i] = re;
      if (re > b.reHigh[i]) b.reHigh[i] = re;
      if (im < b.imLow[i]) b.imLow[i] = im;
      if (im > b.imHigh[i]) b.imHigh[i] = im;
      if (m < b.modulusLow[i]) b.modulusLow[i] = m;
      if (m > b.modulusHigh[i]) b.modulusHigh[i] = m;
      if (p < b.phaseLowDeg[i]) b.phaseLowDeg[i] = p;
      if (p > b.phaseHighDeg[i]) b.phaseHighDeg[i] = p;
    }
  }
  return { frequencyHz: Array.from(grid), ...b, lotCount: spectra.length };
}
