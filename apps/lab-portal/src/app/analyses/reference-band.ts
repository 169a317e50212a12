import type { ReferenceSpectra } from '@ohmprint/contracts';
import { referenceEnvelope, type ReferenceBand } from '@ohmprint/ui';

export const REFERENCE_BAND_LABEL = 'Reference lots (range)';

/** The shaded band behind a sample: the full range of the version's lots at each grid frequency. */
export function referenceBandOf(spectra: ReferenceSpectra): ReferenceBand | null {
  if (spectra.lots.length === 0) return null;
  return referenceEnvelope(
    spectra.lots.map((lot) => ({ label: lot.lotCode, frequencyHz: spectra.frequencyHz, re: lot.re, im: lot.im })),
    { kind: 'range' },
    REFERENCE_BAND_LABEL,
  );
}
