import { equalAspectScales, finiteExtent } from './equal-aspect';

const area = { left: 60, top: 10, width: 500, height: 300 };

describe('equalAspectScales', () => {
  it('gives one data unit the same length on both axes for a wide extent', () => {
    const { x, y } = equalAspectScales([0, 1000], [0, 300], area);
    const xLen = x(100) - x(0);
    const yLen = y(0) - y(100);
    expect(xLen).toBeCloseTo(yLen, 9);
  });

  it('gives one data unit the same length on both axes for a tall extent', () => {
    const { x, y, unitsPerPixel } = equalAspectScales([20, 40], [0, 500], area);
    expect(x(30) - x(20)).toBeCloseTo(y(0) - y(10), 9);
    expect(1 / unitsPerPixel).toBeCloseTo(x(21) - x(20), 9);
  });

  it('keeps the whole data inside the area and draws larger values higher', () => {
    const { x, y } = equalAspectScales([-5, 120], [3, 60], area);
    for (const v of [-5, 120]) {
      expect(x(v)).toBeGreaterThanOrEqual(area.left);
      expect(x(v)).toBeLessThanOrEqual(area.left + area.width);
    }
    expect(y(60)).toBeLessThan(y(3));
    expect(y(3)).toBeLessThanOrEqual(area.top + area.height);
    expect(y(60)).toBeGreaterThanOrEqual(area.top);
  });

  it('still opens a window around a single point', () => {
    const { x, y } = equalAspectScales([5, 5], [2, 2], area);
    expect(x(5)).toBeCloseTo(area.left + area.width / 2, 9);
    expect(y(2)).toBeCloseTo(area.top + area.height / 2, 9);
  });
});

describe('finiteExtent', () => {
  it('ignores NaN and infinities and falls back to [0, 1] when nothing is left', () => {
    expect(finiteExtent([3, NaN, -2], [Infinity, 7])).toEqual([-2, 7]);
    expect(finiteExtent([NaN])).toEqual([0, 1]);
  });
});
