import { canberra } from './canberra';

describe('canberra', () => {
  it('counts a term where both values are zero as 0, as SciPy does', () => {
    // SciPy 1.17 canberra([0,1,0,5],[0,0,2,5.5]) = 43/21 (reference notes).
    expect(canberra([0, 1, 0, 5], [0, 0, 2, 5.5])).toBeCloseTo(43 / 21, 15);
  });

  it('rejects NaN instead of dropping the term, naming the position', () => {
    expect(() => canberra([1, Number.NaN, 3], [1, 2, 3])).toThrow('x[1] is NaN');
    expect(() => canberra([1, 2], [1, Infinity])).toThrow('y[1] is Infinity');
  });

  it('rejects inputs of different lengths and bad weights', () => {
    expect(() => canberra([1, 2, 3], [1, 2])).toThrow('x has 3 values and y has 2');
    expect(() => canberra([1, 2], [2, 1], [1, -1])).toThrow('weights[1] is -1');
    expect(() => canberra([1, 2], [2, 1], [1])).toThrow('1 weights for 2 values');
  });

  it('is symmetric and at most the number of terms', () => {
    const x = [3, -2, 0, 7, 1e-9];
    const y = [-3, 5, 4, 7, -1e9];
    expect(canberra(x, y)).toBe(canberra(y, x));
    expect(canberra(x, y)).toBeLessThanOrEqual(x.length);
  });
});
