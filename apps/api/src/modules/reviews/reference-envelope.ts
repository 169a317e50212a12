import type { Spectrum } from '@ohmprint/spectral-engine';
import type { ReportPlots } from '../reports/pdf/report-data';

/** Spread of the reference lots on the grid: |Z| and phase (degrees) at each frequency. */
export function referenceEnvelope(spectra: readonly Spectrum[], grid: Float64Array): NonNullable<ReportPlots['referenceEnvelope']> {
  const n = grid.length;
  const modulusMin = new Array<number>(n).fill(Infinity);
  const modulusMax = new Array<number>(n).fill(-Infinity);
  const phaseMinDeg = new Array<number>(n).fill(Infinity);
  const phaseMaxDeg = new Array<number>(n).fill(-Infinity);
  const reMin = new Array<number>(n).fill(Infinity);
  const reMax = new Array<number>(n).fill(-Infinity);
  const imMin = new Array<number>(n).fill(Infinity);
  const imMax = new Array<number>(n).fill(-Infinity);
  for (const s of spectra) {
    for (let i = 0; i < n; i++) {
      const m = Math.hypot(s.re[i], s.im[i]);
      const p = (Math.atan2(s.im[i], s.re[i]) * 180) / Math.PI;
      modulusMin[i] = Math.min(modulusMin[i], m);
      modulusMax[i] = Math.max(modulusMax[i], m);
      phaseMinDeg[i] = Math.min(phaseMinDeg[i], p);
      phaseMaxDeg[i] = Math.max(phaseMaxDeg[i], p);
      reMin[i] = Math.min(reMin[i], s.re[i]);
      reMax[i] = Math.max(reMax[i], s.re[i]);
      imMin[i] = Math.min(imMin[i], s.im[i]);
      imMax[i] = Math.max(imMax[i], s.im[i]);
    }
  }
  return { frequencyHz: Array.from(grid), modulusMin, modulusMax, phaseMinDeg, phaseMaxDeg, reMin, reMax, imMin, imMax };
}
