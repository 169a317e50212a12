import { quantile } from '../statistics/quantile';
import { fitLognormal, lognormalQuantile, type LognormalFit } from './lognormal-fit';
import { seededRandom } from './seeded-random';

/**
 * How T95/T99 are taken from a library's leave-one-out nearest distances.
 *
 * - `lognormal-ml` (the default for new methods): a lognormal fitted by maximum likelihood, its
 *   quantiles as the thresholds. Nearest-neighbour distances are positive and right-skewed, and a
 *   lognormal is the usual two-parameter model for such a spread; its fit is closed-form (mean and
 *   standard deviation of the logs), so it never fails to converge and a reviewer can recompute it
 *   with a pocket calculator or `scipy.stats.lognorm.fit(x, floc=0)`. With a dozen lots the fitted
 *   99 % quantile uses every distance, where the empirical one is simply the largest.
 * - `empirical-type7`: the sample quantile (Hyndman–Fan type 7, numpy's and R's default), kept for
 *   large libraries and for labs whose procedures name it.
 */
export type ThresholdEstimator = 'lognormal-ml' | 'empirical-type7';

export const THRESHOLD_ESTIMATOR_NAMES: Record<ThresholdEstimator, string> = {
  'lognormal-ml': 'lognormal fitted by maximum likelihood',
  'empirical-type7': 'empirical quantile (Hyndman–Fan type 7)',
};

/**
 * Bootstrap resamples behind each interval. 2000 keeps the Monte Carlo error of a 95 % percentile
 * limit well below the interval's own width (Efron & Tibshirani 1993 suggest at least 1000 for
 * percentile intervals) and takes a few milliseconds for a few hundred lots.
 */
export const BOOTSTRAP_RESAMPLES = 2000;
/** Coverage of each threshold's interval. */
export const BOOTSTRAP_CONFIDENCE = 0.95;
/** The stored seed: any fixed number makes the interval reproducible; this one is arbitrary. */
export const BOOTSTRAP_SEED = 17025;

export interface ThresholdEstimateOptions {
  readonly estimator?: ThresholdEstimator;
  /** Probabilities of the two thresholds (default 0.95 and 0.99). */
  readonly lowerQuantile?: number;
  readonly upperQuantile?: number;
  /** Number of bootstrap resamples (default BOOTSTRAP_RESAMPLES); 0 gives no intervals. */
  readonly resamples?: number;
  /** Coverage of each interval (default 0.95). */
  readonly confidenceLevel?: number;
  /** Seed of the resampling stream (default BOOTSTRAP_SEED). */
  readonly seed?: number;
}

/** An interval [low, high] in the distance unit (0…1). */
export type Interval = readonly [number, number];

export interface ThresholdEstimate {
  readonly estimator: ThresholdEstimator;
  readonly n: number;
  readonly lowerQuantile: number;
  readonly upperQuantile: number;
  /** T95 and T99 in the distance unit. */
  readonly lower: number;
  readonly upper: number;
  /** Percentile-bootstrap intervals; null when `resamples` is 0. */
  readonly lowerInterval: Interval | null;
  readonly upperInterval: Interval | null;
  readonly resamples: number;
  readonly confidenceLevel: number;
  readonly seed: number;
  /** The fitted distribution (lognormal-ml only). */
  readonly fit: LognormalFit | null;
}

function thresholdsOf(values: ArrayLike<number>, estimator: ThresholdEstimator, q1: number, q2: number): [number, number, LognormalFit | null] {
  if (estimator === 'empirical-type7') return [quantile(values, q1, 'type7'), quantile(values, q2, 'type7'), null];
  const fit = fitLognormal(values);
  return [lognormalQuantile(q1, fit), lognormalQuantile(q2, fit), fit];
}

/**
 * T95/T99 from leave-one-out nearest distances by the chosen estimator, each with a
 * nonparametric percentile-bootstrap interval: `resamples` times, draw n distances with
 * replacement (index ⌊u·n⌋ from the seeded Mulberry32 stream), re-estimate both thresholds, and
 * take the type-7 quantiles (1 − c)/2 and (1 + c)/2 of the re-estimates.
 *
 * The distances of mutual nearest neighbours coincide, so they are not fully independent; the
 * interval treats them as if they were and is, if anything, a little narrow — one more reason
 * the publish limit on its width is a method setting.
 */
export function estimateThresholds(distances: ArrayLike<number>, options: ThresholdEstimateOptions = {}): ThresholdEstimate {
  const estimator = options.estimator ?? 'lognormal-ml';
  const q1 = options.lowerQuantile ?? 0.95;
  const q2 = options.upperQuantile ?? 0.99;
  const resamples = options.resamples ?? BOOTSTRAP_RESAMPLES;
  const confidenceLevel = options.confidenceLevel ?? BOOTSTRAP_CONFIDENCE;
  const seed = options.seed ?? BOOTSTRAP_SEED;
  if (!(estimator in THRESHOLD_ESTIMATOR_NAMES)) throw new RangeError(`estimateThresholds: unknown estimator "${estimator}"`);
  if (!(q1 > 0 && q1 <= q2 && q2 <= 1)) throw new RangeError(`estimateThresholds: quantiles ${q1} and ${q2} must satisfy 0 < lower ≤ upper ≤ 1`);
  if (!(Number.isInteger(resamples) && resamples >= 0 && resamples <= 100_000)) throw new RangeError(`estimateThresholds: resamples ${resamples} must be a whole number from 0 to 100000`);
  if (!(confidenceLevel > 0 && confidenceLevel < 1)) throw new RangeError(`estimateThresholds: confidenceLevel ${confidenceLevel} must lie strictly between 0 and 1`);
  const n = distances.length;
  if (n < 2) throw new RangeError(`estimateThresholds: needs at least two distances, got ${n}`);
  const [lower, upper, fit] = thresholdsOf(distances, estimator, q1, q2);
  let lowerInterval: Interval | null = null;
  let upperInterval: Interval | null = null;
  if (resamples > 0) {
    const random = seededRandom(seed);
    const draw = new Float64Array(n);
    const lows = new Float64Array(resamples);
    const highs = new Float64Array(resamples);
    for (let b = 0; b < resamples; b++) {
      for (let i = 0; i < n; i++) draw[i] = distances[Math.floor(random() * n)];
      [lows[b], highs[b]] = thresholdsOf(draw, estimator, q1, q2);
    }
    const a = (1 - confidenceLevel) / 2;
    lowerInterval = [quantile(lows, a), quantile(lows, 1 - a)];
    upperInterval = [quantile(highs, a), quantile(highs, 1 - a)];
  }
  return { estimator, n, lowerQuantile: q1, upperQuantile: q2, lower, upper, lowerInterval, upperInterval, resamples, confidenceLevel, seed, fit };
}

/** Width of an interval relative to its threshold (0.5 = the interval spans half the threshold). */
export function relativeWidth(threshold: number, interval: Interval): number {
  return threshold > 0 ? (interval[1] - interval[0]) / threshold : Number.POSITIVE_INFINITY;
}
