import { mean, pearson, quantile, regularisedIncompleteBeta, standardDeviation, variance, type QuantileDefinition } from '@ohmprint/spectral-engine';
import fixture from '../fixtures/statistics/statistics.json';

describe('Pearson correlation against scipy.stats.pearsonr', () => {
  it('reproduces the worked values', () => {
    const a = pearson([43, 21, 25, 42, 57, 59], [99, 65, 79, 75, 87, 81]);
    expect(a.r).toBeCloseTo(0.5298089018901743, 14); // scipy.stats.pearsonr, reference notes
    expect(a.p).toBeCloseTo(0.27964465700487195, 12); // scipy.stats.pearsonr, reference notes
    const b = pearson([1, 2, 3, 4, 5], [5, 4, 4, 2, 1]);
    expect(b.r).toBeCloseTo(-0.9622504486493763, 14); // scipy.stats.pearsonr, reference notes
    expect(b.p).toBeCloseTo(0.008754412359024358, 12); // scipy.stats.pearsonr, reference notes
  });

  it.each(fixture.pearson.map((c) => [c.name, c] as const))('matches SciPy: %s', (_name, c) => {
    const result = pearson(c.x, c.y);
    expect(result.n).toBe(c.x.length);
    expect(result.r).toBeCloseTo(c.r, 12); // fixtures/statistics/generate.py (scipy.stats.pearsonr)
    // Relative check: p runs down to 1e-100 and below for strong correlations.
    expect(Math.abs(result.p - c.p)).toBeLessThanOrEqual(1e-9 * Math.max(c.p, 1e-300)); // scipy.stats.pearsonr
  });
});

describe('quantiles against numpy.quantile', () => {
  const cases = fixture.quantiles.map((c) => [`${c.definition} (${c.numpyMethod}) of ${c.values.length} values`, c] as const);
  it.each(cases)('%s', (_name, c) => {
    c.p.forEach((p, i) => {
      expect(quantile(c.values, p, c.definition as QuantileDefinition)).toBeCloseTo(c.q[i], 13); // numpy.quantile(method=…), generate.py
    });
  });
});

describe('summary statistics against numpy', () => {
  it('gives numpy mean, var(ddof=1) and std(ddof=1) on values with a large offset', () => {
    const { values } = fixture.summary;
    expect(mean(values)).toBeCloseTo(fixture.summary.mean, 8); // numpy.mean
    expect(variance(values)).toBeCloseTo(fixture.summary.variance, 9); // numpy.var(ddof=1)
    expect(standardDeviation(values)).toBeCloseTo(fixture.summary.sd, 10); // numpy.std(ddof=1)
  });
});

describe('regularised incomplete beta against scipy.special.betainc', () => {
  it.each(fixture.betainc.map((c) => [c.a, c.b, c.x, c.value]))('I_x(a=%p, b=%p) at x=%p', (a, b, x, value) => {
    // Relative 1e-10: the log-gamma terms (mathjs) carry about 1e-12 relative error each, amplified at large a, b.
    expect(Math.abs(regularisedIncompleteBeta(a, b, x) - value)).toBeLessThanOrEqual(1e-10 * value); // scipy.special.betainc
  });
});
