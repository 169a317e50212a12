import { assertSameGrid } from '../similarity/same-grid';
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
  const distances = distancesToLibrary(sample, library);
  let best = -1;
  for (let index = 0; index < distances.length; index++) if (best < 0 || distances[index] < distances[best]) best = index;
  const found: Neighbour | null = best < 0 ? null : { index: best, distance: distances[best] };
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

/**
 * `spectrumDistance(sample, lot)` for every lot, bit for bit, without its per-lot checks: the grid
 * is compared once per distinct frequency array (a published library's lots share one), the
 * sample's values are checked once, and a lot's values need no check of their own because a NaN
 * or infinite value makes its sum NaN — that lot alone is then re-scored by `spectrumDistance`,
 * which throws the same error it always did. Sums run real parts then imaginary parts, each in
 * frequency order, exactly as `canberra` does (a 0/0 term adds 0 either way).
 */
export function distancesToLibrary(sample: Spectrum, library: readonly Spectrum[]): number[] {
  const distances: number[] = new Array(library.length);
  if (!library.length) return distances;
  // Lot 1 by the checked path: the sample's own problems surface exactly as before, and once it
  // passes, the sample's values are known to be finite.
  try {
    distances[0] = spectrumDistance(sample, library[0]);
  } catch (error) {
    throw new RangeError(`judge: sample against lot 1: ${(error as Error).message}`);
  }
  const n = sample.frequencyHz.length;
  const terms = 2 * n;
  const sre = sample.re;
  const sim = sample.im;
  let checkedGrid: Float64Array = library[0].frequencyHz;
  for (let i = 1; i < library.length; i++) {
    const lot = library[i];
    if (lot.frequencyHz !== checkedGrid || lot.re.length !== n || lot.im.length !== n) {
      try {
        assertSameGrid(sample, lot);
      } catch (error) {
        throw new RangeError(`judge: sample against lot ${i + 1}: ${(error as Error).message}`);
      }
      checkedGrid = lot.frequencyHz;
    }
    const re = lot.re;
    const im = lot.im;
    let reSum = 0;
    for (let j = 0; j < n; j++) {
      const x = sre[j];
      const y = re[j];
      reSum += Math.abs(x - y) / (Math.abs(x) + Math.abs(y) || 1);
    }
    let imSum = 0;
    for (let j = 0; j < n; j++) {
      const x = sim[j];
      const y = im[j];
      imSum += Math.abs(x - y) / (Math.abs(x) + Math.abs(y) || 1);
    }
    const distance = (reSum + imSum) / terms;
    if (distance !== distance) {
      try {
        spectrumDistance(sample, lot);
      } catch (error) {
        throw new RangeError(`judge: sample against lot ${i + 1}: ${(error as Error).message}`);
      }
    }
    distances[i] = distance;
  }
  return distances;
}
