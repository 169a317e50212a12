import { QUANTILE_DEFINITION_NAMES } from '../statistics/quantile';
import type { Calibration } from './calibration';

function percent(q: number): string {
  return `${Number((q * 100).toPrecision(4))} %`;
}

function figure(d: number): string {
  return d.toPrecision(4);
}

/**
 * The decision rule of a calibration as one plain sentence for reports (ISO/IEC 17025 asks the
 * report to state the rule it applied), with the thresholds, quantiles and lot count filled in.
 */
export function decisionRuleText(calibration: Calibration): string {
  const { lowerThreshold: t1, upperThreshold: t2, lowerQuantile: q1, upperQuantile: q2 } = calibration;
  const distance =
    'Distance is the Canberra distance between the real and the imaginary parts of the two spectra on the method grid, divided by the number of terms (0 = identical, 1 = most different).';
  if (t1 === null || t2 === null) {
    return (
      `No verdict is given: the reference library holds ${calibration.lotCount} lot${calibration.lotCount === 1 ? '' : 's'} ` +
      `and the method requires at least ${calibration.minimumLots} to set its thresholds. ${distance}`
    );
  }
  return (
    `A sample is consistent with the reference library when its distance to the nearest reference lot is at most ` +
    `T${Math.round(q1 * 100)} = ${figure(t1)}, inconclusive when it is above that and at most T${Math.round(q2 * 100)} = ${figure(t2)}, ` +
    `and not consistent above T${Math.round(q2 * 100)}. The thresholds are the ${percent(q1)} and ${percent(q2)} quantiles ` +
    `(${QUANTILE_DEFINITION_NAMES[calibration.quantileDefinition]}) of the distances from each of the library's ` +
    `${calibration.lotCount} lots to its nearest other lot. ${distance}`
  );
}
