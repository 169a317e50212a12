import { kkResidualLayout } from './kk-residual-layout';

describe('kkResidualLayout', () => {
  const f = [0.1, 1, 10, 100, 1000];
  it('draws the ±limit lines symmetrically about zero', () => {
    const layout = kkResidualLayout({ frequencyHz: f, rePercent: [0.1, -0.2, 0.05, 0.3, -0.1], imPercent: [0, 0.1, -0.1, 0.2, 0], limitPercent: 1 }, 480, 240);
    const zero = (layout.limitLines.upper + layout.limitLines.lower) / 2;
    const zeroTick = layout.yTicks.find((t) => t.label === '0 %');
    expect(zeroTick?.position).toBeCloseTo(zero, 6);
    expect(layout.outside).toHaveLength(0);
  });

  it('keeps large residuals on the chart and rings the points past the limit', () => {
    const layout = kkResidualLayout({ frequencyHz: f, rePercent: [0.1, 2.4, 0.05, 0.3, -1.7], imPercent: [0, 0.1, -0.1, 0.2, 0], limitPercent: 1 }, 480, 240);
    expect(layout.outside).toHaveLength(2);
    for (const p of layout.outside) {
      expect(p.y).toBeGreaterThanOrEqual(layout.area.top);
      expect(p.y).toBeLessThanOrEqual(layout.area.top + layout.area.height);
    }
  });
});
