import { quantileSorted } from './quantile';

describe('quantileSorted', () => {
  const sorted = [0.031, 0.044, 0.052, 0.038, 0.061, 0.047, 0.029, 0.055, 0.072, 0.041].sort((a, b) => a - b);

  it('matches numpy.percentile (linear method) at the percentiles a band uses', () => {
    // numpy 2.4.6: np.percentile(x, [5, 25, 50, 95, 99])
    expect(quantileSorted(sorted, 0.05)).toBeCloseTo(0.0299, 12);
    expect(quantileSorted(sorted, 0.25)).toBeCloseTo(0.03875, 12);
    expect(quantileSorted(sorted, 0.5)).toBeCloseTo(0.0455, 12);
    expect(quantileSorted(sorted, 0.95)).toBeCloseTo(0.06705, 12);
    expect(quantileSorted(sorted, 0.99)).toBeCloseTo(0.07101, 12);
  });

  it('returns the extremes at 0 and 1', () => {
    expect(quantileSorted(sorted, 0)).toBe(0.029);
    expect(quantileSorted(sorted, 1)).toBe(0.072);
  });

  it('refuses an empty set and a probability outside [0, 1]', () => {
    expect(() => quantileSorted([], 0.5)).toThrow('empty');
    expect(() => quantileSorted(sorted, 1.2)).toThrow('outside [0, 1]');
  });
});
