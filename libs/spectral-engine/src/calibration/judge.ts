import { spectrumDistance } from '../similarity/spectrum-distance';
import type { Neighbour } from '../similarity/spectrum-index';
import type { Spectrum } from '../spectrum';
import { NOT_ENOUGH_LOTS, type Calibration } from './calibration';

/** The outcome of scoring a sample against a calibrated library. */
export type Verdict = 'consistent' | 'inconclusive' | 'not-consistent' | 'no-verdict';

export interface Judgement {
  /** Nearest reference lot and its `spectrumDistance` (0…1); null for an empty library. */
  readonly nearest: Neighbour | null;
  /** Distance (0…1) from the sample to every lot, in library order. */
  readonly distances: readonly number[];
  /**
   * Share (0…1) of the library's leave-one-out distances that exceed the sample's nearest
   * distance: near 1 for a very typical sample, 0 beyond every lot's own spread; null without a verdict.
   */
  readonly typicality: number | null;
  readonly verdict: Verdict;
  /** Why there is no verdict, or null. */
  readonly reason: string | null;
}

/**
 * Scores a sample against the library its calibration came from, by the decision rule:
 * nearest ≤ T95 → consistent; T95 < nearest ≤ T99 → inconclusive; nearest > T99 → not consistent;
 * no verdict when the library has fewer lots than the method's minimum.
 */
export function judge(sample: Spectrum, library: readonly Spectrum[], calibration: Calibration): Judgement {
  if (calibration.lotCount !== library.length) {
    throw new RangeError(`judge: the calibration covers ${calibration.lotCount} lots but the library has ${library.length}; recalibrate the library or use the calibration stored with it`);
  }
  const distances = library.map((lot, i) => {
    try {
      return spectrumDistance(sample, lot);
    } catch (error) {
      throw new RangeError(`judge: sample against lot ${i + 1}: ${(error as Error).message}`);
    }
  });
  let nearest: Neighbour | null = null;
  distances.forEach((distance, index) => {
    if (!nearest || distance < nearest.distance) nearest = { index, distance };
  });
  const found = nearest as Neighbour | null;
  const lower = calibration.lowerThreshold;
  const upper = calibration.upperThreshold;
  if (!found || lower === null || upper === null || calibration.noVerdictReason) {
    return { nearest: found, distances, typicality: null, verdict: 'no-verdict', reason: calibration.noVerdictReason ?? NOT_ENOUGH_LOTS };
  }
  const above = calibration.nearestDistances.filter((d) => d > found.distance).length;
  const typicality = above / calibration.nearestDistances.length;
  const verdict: Verdict = found.distance <= lower ? 'consistent' : found.distance <= upper ? 'inconclusive' : 'not-consistent';
  return { nearest: found, distances, typicality, verdict, reason: null };
}
