import { distanceMatrix } from '../similarity/distance-matrix';
import type { Spectrum } from '../spectrum';
import { axisShares, classicalMds, type MdsGoodnessOfFit } from './classical-mds';

/** One point of the map: a reference lot (by library position) or the sample. */
export interface MapPoint {
  readonly kind: 'reference' | 'sample';
  /** Library position for a reference lot; −1 for the sample. */
  readonly index: number;
  /** Coordinates in units of `spectrumDistance` (dimensionless). */
  readonly x: number;
  readonly y: number;
}

export interface SampleMap {
  readonly points: MapPoint[];
  /** The two leading eigenvalues (dimensionless squared). */
  readonly eigenvalues: readonly [number, number];
  /** How much of the distance structure the two axes show; null for maps too large to decompose fully. */
  readonly goodnessOfFit: MdsGoodnessOfFit | null;
  /** How many of the two axes carry information (an axis with λ ≤ 0 is flat). */
  readonly positiveAxes: number;
  /**
   * Each axis's share of the spread: λₖ / Σ max(λ, 0) over all eigenvalues (so the two add up to
   * `goodnessOfFit.positive`); null when only the largest eigenvalues were computed.
   */
  readonly axisShares: readonly [number, number] | null;
}

/**
 * A 2-D map of a sample among its library's reference lots (all on one grid): classical MDS of
 * their pairwise `spectrumDistance` matrix, the sample last. Needs at least two lots.
 */
export function sampleMap(library: readonly Spectrum[], sample: Spectrum): SampleMap {
  if (library.length < 2) throw new RangeError(`a sample map needs at least two reference lots, got ${library.length}`);
  const mds = classicalMds(distanceMatrix([...library, sample]), 2);
  const points = mds.coordinates.map(([x, y], i): MapPoint =>
    i < library.length ? { kind: 'reference', index: i, x, y } : { kind: 'sample', index: -1, x, y },
  );
  const shares = axisShares(mds.eigenvalues, mds.method === 'full');
  return {
    points,
    eigenvalues: [mds.eigenvalues[0], mds.eigenvalues[1]],
    goodnessOfFit: mds.goodnessOfFit,
    positiveAxes: mds.positiveAxes,
    axisShares: shares ? [shares[0], shares[1]] : null,
  };
}
