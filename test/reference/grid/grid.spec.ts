import { logGrid, resample } from '@ohmprint/spectral-engine';
import fixture from '../fixtures/grid/grid.json';

describe('log grid against numpy.geomspace', () => {
  it.each(fixture.grids.map((g) => [g.fMinHz, g.fMaxHz, g.n, g.grid] as const))('%p Hz to %p Hz in %p points', (lo, hi, n, expected) => {
    const grid = logGrid(lo, hi, n);
    expect(grid).toHaveLength(n);
    expected.forEach((f, i) => expect(Math.abs(grid[i] - f)).toBeLessThanOrEqual(1e-13 * f)); // numpy.geomspace, generate.py
  });
});

describe('resampling against numpy.interp on log10 f', () => {
  it('interpolates an irregular spectrum as numpy does', () => {
    const r = fixture.resample;
    const out = resample({ frequencyHz: Float64Array.from(r.frequencyHz), re: Float64Array.from(r.re), im: Float64Array.from(r.im) }, Float64Array.from(r.grid));
    r.expectedRe.forEach((v, i) => expect(out.re[i]).toBeCloseTo(v, 9)); // numpy.interp(log10 grid, log10 f, re)
    r.expectedIm.forEach((v, i) => expect(out.im[i]).toBeCloseTo(v, 9)); // numpy.interp(log10 grid, log10 f, im)
  });
});
