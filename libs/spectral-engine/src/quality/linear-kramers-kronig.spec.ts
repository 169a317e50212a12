import { impedance } from '../models/impedance';
import { linearKramersKronig } from './linear-kramers-kronig';

const f = Float64Array.from({ length: 50 }, (_, i) => 10 ** (-1 + (6 * i) / 49));

describe('linearKramersKronig', () => {
  it('passes a Randles cell with a diffusion tail, which needs the series capacitance it adds itself', () => {
    const s = impedance('randles-cpe', { rs: 20, rct: 100, q: 25e-6, n: 1, sigma: 300 }, f);
    const auto = linearKramersKronig(s);
    expect(auto.passed).toBe(true);
    expect(linearKramersKronig(s, { capacitance: false }).passed).toBe(false);
  });

  it('fails a spectrum whose imaginary part has the wrong sign at one frequency', () => {
    const s = impedance('r-zarc', { rs: 20, r: 100, q: 1e-4, n: 0.8 }, f);
    const im = Float64Array.from(s.im);
    im[25] = -im[25] * 0.5;
    const result = linearKramersKronig({ ...s, im });
    expect(result.passed).toBe(false);
    const worst = result.residualsImPct.reduce((w, v, i, a) => (Math.abs(v) > Math.abs(a[w]) ? i : w), 0);
    expect(Math.abs(worst - 25)).toBeLessThanOrEqual(1);
  });

  it('uses the limit it is given', () => {
    const s = impedance('r-zarc', { rs: 20, r: 100, q: 1e-4, n: 0.8 }, f);
    const re = s.re.map((v, i) => v * (1 + 0.004 * Math.sin(3.1 * i)));
    expect(linearKramersKronig({ ...s, re }, { limitPct: 0.05 }).passed).toBe(false);
    expect(linearKramersKronig({ ...s, re }, { limitPct: 2 }).passed).toBe(true);
  });

  it('keeps the element count well below the number of points, however the residuals fall', () => {
    const g = (seed: number) => () => (seed = (seed * 16807) % 2147483647) / 2147483647 - 0.5;
    for (const points of [20, 30, 61, 150]) {
      const grid = Float64Array.from({ length: points }, (_, i) => 10 ** (-1 + (6 * i) / (points - 1)));
      // Clean data from one ideal RC element: the residual keeps halving as elements are added.
      const rc = linearKramersKronig(impedance('r-zarc', { rs: 0, r: 100, q: 1e-5, n: 1 }, grid));
      expect(rc.elements).toBeLessThanOrEqual(Math.floor(points / 2));
      expect({ points, passed: rc.passed }).toEqual({ points, passed: points >= 30 });
      // Noise: the count stays near where μ stops the search, far below the point count.
      const clean = impedance('r-zarc', { rs: 20, r: 100, q: 1e-4, n: 0.8 }, grid);
      const noise = g(points);
      const noisy = linearKramersKronig({ frequencyHz: grid, re: clean.re.map((v) => v * (1 + 0.01 * noise())), im: clean.im.map((v) => v * (1 + 0.01 * noise())) });
      expect(noisy.elements).toBeLessThanOrEqual(Math.min(24, Math.floor(points / 2)));
    }
    const capped = linearKramersKronig(impedance('r-zarc', { rs: 0, r: 100, q: 1e-5, n: 1 }, f), { maxElements: 8 });
    expect(capped.elements).toBeLessThanOrEqual(8);
  });

  it('refuses too few points and an out-of-range element count', () => {
    expect(() => linearKramersKronig({ frequencyHz: Float64Array.of(1, 2), re: Float64Array.of(1, 1), im: Float64Array.of(0, 0) })).toThrow(/at least 3 frequencies/);
    const s = impedance('cpe', { q: 1e-5, n: 0.8 }, f);
    expect(() => linearKramersKronig(s, { elements: 0 })).toThrow(/elements must be an integer from 1 to/);
  });
});
