import { createSpectrumIndex } from '../similarity/spectrum-index';
import type { Spectrum } from '../spectrum';
import { quantile, QUANTILE_DEFINITION_NAMES } from '../statistics/quantile';
import { ENGINE_VERSION } from '../version';
import { NOT_ENOUGH_LOTS, type Calibration, type CalibrationOptions } from './calibration';
import { BOOTSTRAP_CONFIDENCE, BOOTSTRAP_RESAMPLES, BOOTSTRAP_SEED, estimateThresholds, THRESHOLD_ESTIMATOR_NAMES } from './threshold-estimator';

/** Why a lognormal cannot be fitted: a zero distance means two lots with identical spectra. */
export const ZERO_DISTANCE = 'two reference lots have identical spectra (a leave-one-out distance of 0), and the lognormal estimator needs distances above 0';

function checkedOptions(options: CalibrationOptions) {
  const lowerQuantile = options.lowerQuantile ?? 0.95;
  const upperQuantile = options.upperQuantile ?? 0.99;
  const quantileDefinition = options.quantileDefinition ?? 'type7';
  const minimumLots = options.minimumLots ?? 5;
  const thresholdEstimator = options.thresholdEstimator ?? 'empirical-type7';
  const bootstrapResamples = options.bootstrapResamples ?? BOOTSTRAP_RESAMPLES;
  if (!(thresholdEstimator in THRESHOLD_ESTIMATOR_NAMES)) throw new RangeError(`calibration: unknown threshold estimator "${thresholdEstimator}"`);
  if (!(lowerQuantile > 0 && lowerQuantile < 1)) throw new RangeError(`calibration: lowerQuantile ${lowerQuantile} must lie strictly between 0 and 1`);
  if (!(upperQuantile >= lowerQuantile && upperQuantile <= 1)) {
    throw new RangeError(`calibration: upperQuantile ${upperQuantile} must lie between lowerQuantile (${lowerQuantile}) and 1`);
  }
  if (!(quantileDefinition in QUANTILE_DEFINITION_NAMES)) throw new RangeError(`calibration: unknown quantile definition "${quantileDefinition}"`);
  if (!(Number.isInteger(minimumLots) && minimumLots >= 2)) throw new RangeError(`calibration: minimumLots must be a whole number of at least 2, got ${minimumLots}`);
  return { lowerQuantile, upperQuantile, quantileDefinition, minimumLots, thresholdEstimator, bootstrapResamples };
}

/**
 * Calibrates a reference library (authentic lots on one grid): each lot's leave-one-out
 * distance to its nearest other lot, and the thresholds T95/T99 at the method's quantiles of
 * those distances. Below `minimumLots` the thresholds are null and verdicts are withheld.
 */
export function calibrate(library: readonly Spectrum[], options: CalibrationOptions = {}): Calibration {
  const settings = checkedOptions(options);
  const nearestDistances: number[] = [];
  const nearestLots: number[] = [];
  const onProgress = options.onProgress;
  if (library.length >= 2) {
    const index = createSpectrumIndex(library);
    library.forEach((lot, i) => {
      // The lot finds itself at distance 0; of its two nearest, take the first that is another lot.
      const other = index.nearest(lot, 2).find((hit) => hit.index !== i);
      if (!other) throw new RangeError(`calibration: lot ${i + 1} has no other lot to compare with`);
      nearestDistances.push(other.distance);
      nearestLots.push(other.index);
      onProgress?.(i + 1, library.length);
    });
  } else {
    onProgress?.(library.length, library.length);
  }
  const { bootstrapResamples, ...kept } = settings;
  const bootstrap = { resamples: bootstrapResamples, confidenceLevel: BOOTSTRAP_CONFIDENCE, seed: BOOTSTRAP_SEED };
  const base = { lotCount: library.length, ...kept, nearestDistances, nearestLots, engineVersion: ENGINE_VERSION, bootstrap };
  const none = { lowerThreshold: null, upperThreshold: null, lowerInterval: null, upperInterval: null, fit: null };
  if (library.length < settings.minimumLots) return { ...base, ...none, noVerdictReason: NOT_ENOUGH_LOTS };
  if (settings.thresholdEstimator === 'lognormal-ml' && nearestDistances.some((d) => d <= 0)) return { ...base, ...none, noVerdictReason: ZERO_DISTANCE };
  const estimate = estimateThresholds(nearestDistances, {
    estimator: settings.thresholdEstimator,
    lowerQuantile: settings.lowerQuantile,
    upperQuantile: settings.upperQuantile,
    resamples: bootstrapResamples,
    confidenceLevel: BOOTSTRAP_CONFIDENCE,
    seed: BOOTSTRAP_SEED,
  });
  // The empirical estimator keeps the stored quantile definition (type 7 unless a caller chose another).
  const empirical = settings.thresholdEstimator === 'empirical-type7';
  return {
    ...base,
    lowerThreshold: empirical ? quantile(nearestDistances, settings.lowerQuantile, settings.quantileDefinition) : estimate.lower,
    upperThreshold: empirical ? quantile(nearestDistances, settings.upperQuantile, settings.quantileDefinition) : estimate.upper,
    lowerInterval: estimate.lowerInterval,
    upperInterval: estimate.upperInterval,
    fit: estimate.fit,
    noVerdictReason: null,
  };
}
