import { createSpectrumIndex } from '../similarity/spectrum-index';
import type { Spectrum } from '../spectrum';
import { quantile, QUANTILE_DEFINITION_NAMES } from '../statistics/quantile';
import { ENGINE_VERSION } from '../version';
import { NOT_ENOUGH_LOTS, type Calibration, type CalibrationOptions } from './calibration';

function checkedOptions(options: CalibrationOptions) {
  const lowerQuantile = options.lowerQuantile ?? 0.95;
  const upperQuantile = options.upperQuantile ?? 0.99;
  const quantileDefinition = options.quantileDefinition ?? 'type7';
  const minimumLots = options.minimumLots ?? 5;
  if (!(lowerQuantile > 0 && lowerQuantile < 1)) throw new RangeError(`calibration: lowerQuantile ${lowerQuantile} must lie strictly between 0 and 1`);
  if (!(upperQuantile >= lowerQuantile && upperQuantile <= 1)) {
    throw new RangeError(`calibration: upperQuantile ${upperQuantile} must lie between lowerQuantile (${lowerQuantile}) and 1`);
  }
  if (!(quantileDefinition in QUANTILE_DEFINITION_NAMES)) throw new RangeError(`calibration: unknown quantile definition "${quantileDefinition}"`);
  if (!(Number.isInteger(minimumLots) && minimumLots >= 2)) throw new RangeError(`calibration: minimumLots must be a whole number of at least 2, got ${minimumLots}`);
  return { lowerQuantile, upperQuantile, quantileDefinition, minimumLots };
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
  if (library.length >= 2) {
    const index = createSpectrumIndex(library);
    library.forEach((lot, i) => {
      // The lot finds itself at distance 0; of its two nearest, take the first that is another lot.
      const other = index.nearest(lot, 2).find((hit) => hit.index !== i);
      if (!other) throw new RangeError(`calibration: lot ${i + 1} has no other lot to compare with`);
      nearestDistances.push(other.distance);
      nearestLots.push(other.index);
    });
  }
  const enough = library.length >= settings.minimumLots;
  return {
    lotCount: library.length,
    ...settings,
    nearestDistances,
    nearestLots,
    lowerThreshold: enough ? quantile(nearestDistances, settings.lowerQuantile, settings.quantileDefinition) : null,
    upperThreshold: enough ? quantile(nearestDistances, settings.upperQuantile, settings.quantileDefinition) : null,
    noVerdictReason: enough ? null : NOT_ENOUGH_LOTS,
    engineVersion: ENGINE_VERSION,
  };
}
