import type { Spectrum } from '../spectrum';
import { calibrate } from './calibrate';
import { NOT_ENOUGH_LOTS } from './calibration';
import { decisionRuleText } from './decision-rule';
import { judge } from './judge';

const GRID = Float64Array.from([10, 100, 1000]);

/** A lot whose real part is scaled by (1 + offset); its distance to an unscaled lot is known in closed form. */
const lot = (offset: number): Spectrum => ({
  frequencyHz: GRID,
  re: Float64Array.from([100, 80, 60].map((v) => v * (1 + offset))),
  im: Float64Array.from([-50, -60, -40]),
});

/** Canberra distance between re·(1+a) and re·(1+b) with the imaginary parts equal: |a−b|/(2+a+b) per real term, ÷ 2. */
const expectedDistance = (a: number, b: number) => Math.abs(a - b) / (2 + a + b) / 2;

describe('calibrate', () => {
  const offsets = [0, 0.01, 0.03, 0.04, 0.08, 0.1];
  const library = offsets.map(lot);

  it('takes each lot’s leave-one-out distance to its nearest other lot', () => {
    const calibration = calibrate(library);
    expect(calibration.nearestLots).toEqual([1, 0, 3, 2, 5, 4]);
    calibration.nearestDistances.forEach((d, i) => expect(d).toBeCloseTo(expectedDistance(offsets[i], offsets[calibration.nearestLots[i]]), 14));
  });

  it('sets T95 and T99 at type-7 quantiles of those distances', () => {
    const calibration = calibrate(library);
    const sorted = [...calibration.nearestDistances].sort((a, b) => a - b);
    // Type 7 with n = 6: position (n − 1)·p = 4.75 and 4.95 between the 5th and 6th smallest.
    expect(calibration.lowerThreshold).toBeCloseTo(sorted[4] + 0.75 * (sorted[5] - sorted[4]), 15);
    expect(calibration.upperThreshold).toBeCloseTo(sorted[4] + 0.95 * (sorted[5] - sorted[4]), 15);
    expect(calibration.quantileDefinition).toBe('type7');
    expect(calibration.noVerdictReason).toBeNull();
  });

  it('withholds thresholds below the method’s minimum number of lots', () => {
    const small = calibrate(library.slice(0, 4));
    expect(small.lowerThreshold).toBeNull();
    expect(small.noVerdictReason).toBe(NOT_ENOUGH_LOTS);
    expect(calibrate(library.slice(0, 4), { minimumLots: 4 }).lowerThreshold).not.toBeNull();
  });

  it('rejects settings that make no sense', () => {
    expect(() => calibrate(library, { lowerQuantile: 0.99, upperQuantile: 0.95 })).toThrow('upperQuantile 0.95 must lie between lowerQuantile (0.99) and 1');
    expect(() => calibrate(library, { minimumLots: 1 })).toThrow('minimumLots must be a whole number of at least 2');
  });
});

describe('judge', () => {
  const library = [0, 0.01, 0.02, 0.03, 0.04].map(lot);
  const calibration = calibrate(library);
  const t95 = calibration.lowerThreshold as number;
  const t99 = calibration.upperThreshold as number;

  it('calls a sample inside the library’s own spread consistent', () => {
    const result = judge(lot(0.015), library, calibration);
    expect(result.verdict).toBe('consistent');
    expect(result.nearest?.distance).toBeLessThanOrEqual(t95);
    expect(result.distances).toHaveLength(5);
    expect(result.typicality).toBe(1);
  });

  it('applies the decision rule at and between the thresholds', () => {
    // With re scaled by (1+s) against the last lot (offset 0.04), the distance is (s−0.04)/(2+s+0.04)/2: solve for a chosen distance.
    const atDistance = (d: number) => lot((0.04 * (1 + 2 * d) + 4 * d) / (1 - 2 * d));
    expect(judge(atDistance((t95 + t99) / 2), library, calibration).verdict).toBe('inconclusive');
    const far = judge(atDistance(t99 * 1.5), library, calibration);
    expect(far.verdict).toBe('not-consistent');
    expect(far.typicality).toBe(0);
    expect(far.nearest?.index).toBe(4);
  });

  it('gives no verdict for a library that is too small, but still the distances', () => {
    const small = library.slice(0, 3);
    const result = judge(lot(0.5), small, calibrate(small));
    expect(result.verdict).toBe('no-verdict');
    expect(result.reason).toBe('not enough reference lots');
    expect(result.distances).toHaveLength(3);
  });

  it('refuses a calibration from another library', () => {
    expect(() => judge(lot(0), library.slice(0, 4), calibration)).toThrow('the calibration covers 5 lots but the library has 4');
  });
});

describe('decisionRuleText', () => {
  it('states the thresholds, quantiles and lot count', () => {
    const calibration = calibrate([0, 0.01, 0.02, 0.03, 0.04].map(lot));
    const text = decisionRuleText(calibration);
    expect(text).toContain(`T95 = ${(calibration.lowerThreshold as number).toPrecision(4)}`);
    expect(text).toContain(`T99 = ${(calibration.upperThreshold as number).toPrecision(4)}`);
    expect(text).toContain('95 % and 99 % quantiles (Hyndman–Fan type 7');
    expect(text).toContain('5 lots');
  });

  it('says why there is no verdict for a small library', () => {
    expect(decisionRuleText(calibrate([lot(0), lot(0.01)]))).toMatch(/^No verdict is given: the reference library holds 2 lots and the method requires at least 5/);
  });
});

describe('calibrate with the lognormal estimator', () => {
  const offsets = [0, 0.01, 0.03, 0.04, 0.08, 0.1, 0.13, 0.15];
  const library = offsets.map(lot);

  it('fits the thresholds and gives each an interval that contains it', () => {
    const c = calibrate(library, { thresholdEstimator: 'lognormal-ml' });
    expect(c.thresholdEstimator).toBe('lognormal-ml');
    expect(c.upperThreshold!).toBeGreaterThan(c.lowerThreshold!);
    expect(c.lowerInterval![0]).toBeLessThanOrEqual(c.lowerThreshold!);
    expect(c.upperInterval![1]).toBeGreaterThanOrEqual(c.upperThreshold!);
  });

  it('is reproducible: the same lots give the same intervals', () => {
    expect(calibrate(library, { thresholdEstimator: 'lognormal-ml' }).upperInterval).toEqual(calibrate(library, { thresholdEstimator: 'lognormal-ml' }).upperInterval);
  });

  it('withholds thresholds when two lots are identical, saying why', () => {
    const c = calibrate([...library, lot(0.1)], { thresholdEstimator: 'lognormal-ml' });
    expect(c.upperThreshold).toBeNull();
    expect(c.noVerdictReason).toMatch(/identical spectra/);
  });

  it('keeps the empirical estimator as the default for callers that name none', () => {
    expect(calibrate(library).thresholdEstimator).toBe('empirical-type7');
  });
});
