import type { ReferenceBandView } from '@ohmprint/contracts';
import { normaliseSpectrum } from '@ohmprint/spectral-engine';
import type { SpectrumSeries } from '@ohmprint/ui';

/**
 * Replicates as the library version would see them: divided by their cell constant and referred to
 * the version's temperature, so they sit in the same Ω·cm as the reference band. Each keeps its own
 * frequencies; the charts need no common grid.
 */
export function normalisedReplicates(
  replicates: readonly (SpectrumSeries & { readonly cellConstantPerCm: number; readonly temperatureC: number })[],
  reference: Pick<ReferenceBandView, 'referenceTemperatureC' | 'temperatureCoefficientPerC'>,
): SpectrumSeries[] {
  return replicates.map((r) => {
    const n = normaliseSpectrum(
      { frequencyHz: Float64Array.from(r.frequencyHz), re: Float64Array.from(r.re), im: Float64Array.from(r.im) },
      { cellConstantPerCm: r.cellConstantPerCm, temperatureC: r.temperatureC, referenceTemperatureC: reference.referenceTemperatureC, coefficientPerC: reference.temperatureCoefficientPerC },
    );
    return { label: r.label, frequencyHz: n.frequencyHz, re: n.re, im: n.im, muted: r.muted };
  });
}
