import { pearson } from './pearson';
import { quantile } from './quantile';
import { mean, standardDeviation, summarise } from './summary';

describe('pearson', () => {
  it('gives r = ±1 and p = 0 for a perfect line, p = 1 for two pairs (as SciPy)', () => {
    expect(pearson([1, 2, 3, 4], [2, 4, 6, 8])).toEqual({ r: 1, p: 0, n: 4 });
    expect(pearson([1, 2, 3], [3, 2, 1]).r).toBeCloseTo(-1, 15);
    expect(pearson([1, 2], [5, 3])).toEqual({ r: -1, p: 1, n: 2 });
  });

  it('explains why it cannot correlate', () => {
    expect(() => pearson([1, 1, 1], [1, 2, 3])).toThrow('x is constant');
    expect(() => pearson([1, 2, 3], [1, 2])).toThrow('x has 3 values and y has 2');
    expect(() => pearson([1, Number.NaN, 3], [1, 2, 3])).toThrow('x[1] is NaN');
  });
});

describe('quantile', () => {
  it('interpolates between order statistics by type 7 by default', () => {
    // numpy documentation example: np.quantile([10, 7, 4, 3, 2, 1], 0.5) = 3.5.
    expect(quantile([10, 7, 4, 3, 2, 1], 0.5)).toBe(3.5);
    expect(quantile([1, 2, 3, 4], 0.25)).toBe(1.75);
    expect(quantile([1, 2, 3, 4], 0.25, 'type6')).toBe(1.25);
  });

  it('rejects a probability outside [0, 1] or an empty sample', () => {
    expect(() => quantile([1, 2], 1.5)).toThrow('probability 1.5 must lie in [0, 1]');
    expect(() => quantile([], 0.5)).toThrow('at least one value');
  });
});

describe('summary statistics', () => {
  it('uses n − 1 for the standard deviation', () => {
    expect(standardDeviation([2, 4, 4, 4, 5, 5, 7, 9])).toBeCloseTo(Math.sqrt(32 / 7), 14);
    expect(mean([2, 4, 4, 4, 5, 5, 7, 9])).toBe(5);
    expect(summarise([3])).toEqual({ count: 1, min: 3, max: 3, mean: 3, sd: null });
  });
});
