import type { ReferenceBandPoints } from '@ohmprint/contracts';
import type { ReferenceBand } from '@ohmprint/ui';

export const REFERENCE_BAND_LABEL = 'Reference lots (range)';

/** The shaded band behind a sample: the full range of the version's lots at each grid frequency, as the API stored it at publication. */
export function referenceBandOf(points: ReferenceBandPoints | null | undefined): ReferenceBand | null {
  if (!points || points.lotCount === 0) return null;
  return { label: REFERENCE_BAND_LABEL, ...points };
}
