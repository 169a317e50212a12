import type { MethodSettings } from '@ohmprint/contracts';

/**
 * A lab's method until its admin changes it. The band keeps clear of electrode polarisation
 * below 100 Hz and cable effects near 1 MHz (common practice for dip cells); 2 %/°C is the usual
 * linear temperature coefficient (common practice); the 2 % Kramers–Kronig limit is a rule of
 * thumb, not a standard, which is why it is a setting. The 0.5 °C allowed between a typed and a
 * file's temperature is the lab's choice: at 2 %/°C it moves a spectrum by about 1 %.
 * Thresholds come from a lognormal fitted to
 * the leave-one-out distances (see the engine's threshold-estimator.ts); a version whose 95 %
 * bootstrap interval of a threshold spans more than the threshold itself is not published — a
 * starting point for the lab to tighten, not a standard.
 */
export const DEFAULT_METHOD: MethodSettings = {
  bandMinHz: 100,
  bandMaxHz: 500_000,
  gridPoints: 41,
  referenceTemperatureC: 20,
  temperatureCoefficientPerC: 0.02,
  lowerQuantile: 0.95,
  upperQuantile: 0.99,
  minimumLots: 5,
  minimumReplicates: 2,
  model: 'cole-cole',
  kkResidualLimitPercent: 2,
  replicateDistanceLimit: 0.01,
  temperatureMismatchLimitC: 0.5,
  thresholdEstimator: 'lognormal-ml',
  maxThresholdIntervalWidth: 1,
};
