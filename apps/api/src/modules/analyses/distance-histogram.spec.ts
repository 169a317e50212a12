import { distanceHistogram } from './distance-histogram';

describe('distance histogram', () => {
  it('counts every calibration distance once and reaches past the sample', () => {
    const distances = [0.001, 0.002, 0.002, 0.003, 0.004, 0.004, 0.005, 0.006, 0.009];
    const h = distanceHistogram(distances, 0.02);
    expect(h.counts.reduce((a, b) => a + b, 0)).toBe(distances.length);
    expect(h.binEdges[h.binEdges.length - 1]).toBeGreaterThan(0.02);
    expect(h.binEdges).toHaveLength(h.counts.length + 1);
  });
});
