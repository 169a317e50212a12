import { ReportData } from './report-data';
import { formatNumber } from './report-formats';

/** Fixed statements every report carries; kept in one place so reports and screens agree. */
export const SCREENING_CAUTION =
  'An impedance fingerprint is a screening method: it tells whether a sample is consistent with the ' +
  "producer's reference library under the stated method. It does not prove origin or identity by itself; " +
  "a 'not consistent' result should be confirmed by an accredited confirmatory method before legal or " +
  'commercial action. Results relate only to the items tested. Follow local regulations on how such ' +
  'results may be used.';

export const SAFETY_NOTE =
  'Measurements are made at low voltage, but samples may be alcoholic, flammable or perishable: follow the ' +
  "laboratory's safety and food-handling rules and local regulations when handling retained material.";

export const ITEMS_TESTED =
  'The results in this report relate only to the item tested, as received. The item was obtained and ' +
  'supplied by the client; the laboratory took no part in sampling.';

export const DEMO_MARK = 'Demonstration report: invented data, not a real test';

export const REPRODUCTION =
  'This report shall not be reproduced except in full. Its authenticity can be checked online with the ' +
  'report number and verification code below, or by uploading the PDF.';

const pct = (q: number): string => `${Number((q * 100).toFixed(1))} %`;

/** The decision rule in words, with the thresholds this report applied. */
export function decisionRule(data: ReportData): string {
  const { t95, t99 } = data.results;
  const { lower, upper } = data.method.quantiles;
  const at = (t: number | null) => (t === null ? 'not available' : formatNumber(t, 3));
  return (
    `Decision rule: T95 (${at(t95)}) and T99 (${at(t99)}) are the ${pct(lower)} and ${pct(upper)} quantiles of ` +
    "the library's own spread (each reference lot's leave-one-out distance to its nearest other lot). " +
    'A nearest distance at or below T95 reads as consistent with the reference library; above T95 and up ' +
    'to T99 as inconclusive; above T99 as not consistent. A library with too few lots gives no verdict.'
  );
}

/** How the thresholds were set and how sure they are, in one sentence; null when the report predates it. */
export function thresholdStatement(data: ReportData): string | null {
  const t = data.method.thresholds;
  if (!t) return null;
  const range = (i: [number, number] | null) => (i ? `${formatNumber(i[0], 2)} to ${formatNumber(i[1], 2)}` : 'not available');
  const level = t.confidenceLevel === null ? '' : `${Math.round(t.confidenceLevel * 100)} % `;
  const intervals =
    t.t95Interval || t.t99Interval
      ? ` ${level}bootstrap intervals${t.resamples ? ` (${t.resamples} resamples)` : ''}: T95 ${range(t.t95Interval)}, T99 ${range(t.t99Interval)}.`
      : ' No uncertainty interval was computed for this library version.';
  return `Thresholds estimated by ${t.estimator} from the leave-one-out distances of n = ${t.lotCount} reference lots.${intervals}`;
}
