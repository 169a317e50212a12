import type { QuantileDefinition } from '../statistics/quantile';
import type { LognormalFit } from './lognormal-fit';
import type { Interval, ThresholdEstimator } from './threshold-estimator';

/** The reason given with `no-verdict` when a library is too small to calibrate. */
export const NOT_ENOUGH_LOTS = 'not enough reference lots';

/** Settings of a method's calibration; every field has a default. */
export interface CalibrationOptions {
  /** Quantile of the leave-one-out distances that bounds "consistent" (default 0.95 → T95). */
  readonly lowerQuantile?: number;
  /** Quantile that bounds "inconclusive" (default 0.99 → T99). */
  readonly upperQuantile?: number;
  /** Sample-quantile definition (default `type7`, numpy's and R's default). */
  readonly quantileDefinition?: QuantileDefinition;
  /** Fewest reference lots that give a verdict (default 5; at least 2). */
  readonly minimumLots?: number;
  /**
   * How the thresholds are estimated (default `empirical-type7`, what versions calibrated before
   * the choice existed used; methods default to `lognormal-ml`).
   */
  readonly thresholdEstimator?: ThresholdEstimator;
  /** Bootstrap resamples behind the threshold intervals (default BOOTSTRAP_RESAMPLES). */
  readonly bootstrapResamples?: number;
  /**
   * Told how far the leave-one-out comparison is: after each lot (`lotsDone` of `lotCount`), and
   * once more with `lotsDone === lotCount` before the thresholds are estimated. Not stored.
   */
  readonly onProgress?: (lotsDone: number, lotCount: number) => void;
}

/**
 * A library's calibration: each lot's leave-one-out distance to its nearest other lot and the
 * thresholds taken from them. Plain data, so it can be stored with a published library version.
 */
export interface Calibration {
  readonly lotCount: number;
  readonly minimumLots: number;
  readonly lowerQuantile: number;
  readonly upperQuantile: number;
  readonly quantileDefinition: QuantileDefinition;
  /** Per lot (library order): `spectrumDistance` (0…1) to its nearest other lot; empty below two lots. */
  readonly nearestDistances: readonly number[];
  /** Per lot: library position of that nearest other lot. */
  readonly nearestLots: readonly number[];
  /** T95: distance (0…1) at `lowerQuantile`; null when there are too few lots. */
  readonly lowerThreshold: number | null;
  /** T99: distance (0…1) at `upperQuantile`; null when there are too few lots. */
  readonly upperThreshold: number | null;
  /** Why the calibration gives no verdict, or null when it does. */
  readonly noVerdictReason: string | null;
  /** Engine version that computed it, for the report's method section. */
  readonly engineVersion: string;
  /**
   * The estimator behind the thresholds. Absent on calibrations stored before the choice existed,
   * which were all `empirical-type7` without intervals.
   */
  readonly thresholdEstimator?: ThresholdEstimator;
  /** Percentile-bootstrap intervals of T95 and T99 (distance unit), or null without thresholds. */
  readonly lowerInterval?: Interval | null;
  readonly upperInterval?: Interval | null;
  /** How the intervals were drawn: resamples, coverage and the seed of the stream. */
  readonly bootstrap?: { readonly resamples: number; readonly confidenceLevel: number; readonly seed: number };
  /** The fitted lognormal (lognormal-ml only). */
  readonly fit?: LognormalFit | null;
}
