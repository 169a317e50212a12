import { calibrate, estimateThresholds, fitLognormal, lognormalQuantile, seededRandom } from '@ohmprint/spectral-engine';
import fixture from '../fixtures/thresholds/thresholds.json';

// Every expected value below comes from fixtures/thresholds/generate.py (SciPy 1.17 / numpy 2).

describe('Mulberry32 stream', () => {
  it.each(fixture.mulberry32.map((s) => [s.seed, s] as const))('seed %d gives the stream of the Python rewrite in generate.py', (_seed, s) => {
    const random = seededRandom(s.seed);
    s.first.forEach((u) => expect(random()).toBe(u)); // generate.py mulberry32 (exact: 32-bit integer arithmetic)
  });
});

describe.each(fixture.cases.map((c) => [c.name, c] as const))('%s', (_name, c) => {
  it('fits the lognormal SciPy fits', () => {
    const fit = fitLognormal(c.distances);
    expect(fit.sigma).toBeCloseTo(c.lognormal.s, 10); // scipy.stats.lognorm.fit(x, floc=0) shape s
    expect(Math.exp(fit.mu) / c.lognormal.scale).toBeCloseTo(1, 10); // scipy.stats.lognorm.fit(x, floc=0) scale
  });

  it('takes the thresholds at SciPy’s lognormal quantiles', () => {
    const fit = fitLognormal(c.distances);
    expect(lognormalQuantile(c.q1, fit) / c.ppf.lower).toBeCloseTo(1, 10); // scipy.stats.lognorm.ppf(q1, s, scale=scale)
    expect(lognormalQuantile(c.q2, fit) / c.ppf.upper).toBeCloseTo(1, 10); // scipy.stats.lognorm.ppf(q2, s, scale=scale)
  });

  it('gives the bootstrap intervals recomputed with SciPy, resample by resample', () => {
    const e = estimateThresholds(c.distances, { estimator: 'lognormal-ml', lowerQuantile: c.q1, upperQuantile: c.q2 });
    expect(e.resamples).toBe(fixture.resamples);
    expect(e.seed).toBe(fixture.seed);
    e.lowerInterval!.forEach((v, i) => expect(v / c.bootstrapLognormal.lower[i]).toBeCloseTo(1, 9)); // generate.py bootstrap(): lognorm.fit + ppf per resample, numpy.quantile
    e.upperInterval!.forEach((v, i) => expect(v / c.bootstrapLognormal.upper[i]).toBeCloseTo(1, 9)); // same
    const empirical = estimateThresholds(c.distances, { estimator: 'empirical-type7', lowerQuantile: c.q1, upperQuantile: c.q2 });
    expect(empirical.lower).toBeCloseTo(c.empirical.lower, 14); // numpy.quantile(method='linear')
    expect(empirical.upper).toBeCloseTo(c.empirical.upper, 14); // numpy.quantile(method='linear')
    empirical.upperInterval!.forEach((v, i) => expect(v / c.bootstrapEmpirical.upper[i]).toBeCloseTo(1, 12)); // generate.py bootstrap(), numpy.quantile
  });

  it('agrees with scipy.stats.bootstrap (percentile, its own random stream) within Monte Carlo error', () => {
    const e = estimateThresholds(c.distances, { estimator: 'lognormal-ml', lowerQuantile: c.q1, upperQuantile: c.q2 });
    const width = c.bootstrapLognormal.upper[1] - c.bootstrapLognormal.upper[0];
    // Two streams of 2000 resamples: limits differ by a few per cent of the interval's width.
    e.upperInterval!.forEach((v, i) => expect(Math.abs(v - c.bootstrapLognormal.scipyUpper[i])).toBeLessThan(0.15 * width)); // scipy.stats.bootstrap(method='percentile')
  });
});

describe('the interval narrows as lots are added', () => {
  it('is narrower for 40 lots than for 5, relative to the threshold', () => {
    const small = fixture.cases.find((c) => c.name === '5 lots')!;
    const large = fixture.cases.find((c) => c.name.startsWith('40 lots'))!;
    const rel = (c: typeof small) => (c.bootstrapLognormal.upper[1] - c.bootstrapLognormal.upper[0]) / c.ppf.upper; // generate.py
    const e5 = estimateThresholds(small.distances);
    const e40 = estimateThresholds(large.distances);
    expect((e5.upperInterval![1] - e5.upperInterval![0]) / e5.upper).toBeCloseTo(rel(small), 8);
    expect((e40.upperInterval![1] - e40.upperInterval![0]) / e40.upper).toBeLessThan(rel(small));
  });
});

describe('calibrate with the lognormal estimator', () => {
  it('states the estimator, n and the intervals with the thresholds', () => {
    const c = fixture.cases[0];
    const f = Float64Array.from([1, 10, 100]);
    // Lots whose leave-one-out distances are not the fixture's; only the bookkeeping is checked here.
    const lots = c.distances.map((d, i) => ({ frequencyHz: f, re: Float64Array.from([1 + i * 0.01 + d, 2, 3]), im: Float64Array.from([-1, -2, -3]) }));
    const cal = calibrate(lots, { thresholdEstimator: 'lognormal-ml' });
    expect(cal.thresholdEstimator).toBe('lognormal-ml');
    expect(cal.lotCount).toBe(c.distances.length);
    const direct = estimateThresholds(cal.nearestDistances);
    expect(cal.upperThreshold).toBe(direct.upper);
    expect(cal.upperInterval).toEqual(direct.upperInterval);
    expect(cal.bootstrap).toEqual({ resamples: 2000, confidenceLevel: 0.95, seed: 17025 });
  });
});
