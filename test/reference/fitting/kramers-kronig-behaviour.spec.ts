import { impedance, linearKramersKronig, type Spectrum } from '@ohmprint/spectral-engine';

// The published method's behaviour as REFERENCES.md states it ("Linear Kramers–Kronig test",
// Behaviour [computed: numpy]): 61 points from 100 kHz down to 0.1 Hz, Rs = 20 Ω + ZARC(R = 100 Ω,
// Q = 1e−4, n = 0.8).
const N = 61;
const frequencyHz = Float64Array.from({ length: N }, (_, i) => 10 ** (-1 + (6 * i) / (N - 1)));
const randles = { rs: 20, r: 100, q: 1e-4, n: 0.8 };

/** Standard normal deviates from a fixed seed (Park–Miller generator, Box–Muller). */
function gaussian(seed: number): () => number {
  let state = seed;
  const uniform = () => (state = (state * 16807) % 2147483647) / 2147483647;
  return () => Math.sqrt(-2 * Math.log(uniform())) * Math.cos(2 * Math.PI * uniform());
}

describe('linear Kramers–Kronig test, behaviour of the published method', () => {
  it('fits the synthetic Randles spectrum to about 0.011 % with 20 elements', () => {
    const result = linearKramersKronig(impedance('r-zarc', randles, frequencyHz), { elements: 20 });
    expect(result.maxAbsResidualPct).toBeGreaterThan(0.005); // REFERENCES.md Behaviour: 0.011 % at M = 20
    expect(result.maxAbsResidualPct).toBeLessThan(0.02);
  });

  it('passes the noise-free synthetic Randles spectrum when it chooses the element count itself', () => {
    const result = linearKramersKronig(impedance('r-zarc', randles, frequencyHz));
    expect(result.passed).toBe(true);
    // Residuals within a twentieth of the 1 % limit end the search before μ reaches c = 0.85.
    expect(result.maxAbsResidualPct).toBeLessThan(0.05);
    const strict = linearKramersKronig(impedance('r-zarc', randles, frequencyHz), { limitPct: 1e-6 });
    // Schönleber et al. 2014 raise M until μ ≤ c = 0.85; on this clean arc μ stays above c, and the
    // search ends at its ceiling of half the number of points instead of climbing towards N.
    expect(strict.elements).toBeLessThanOrEqual(Math.floor(N / 2));
    expect(strict.maxAbsResidualPct).toBeLessThan(0.02);
  });

  it('with 0.5 % noise stops near 18 elements and leaves residuals at the noise level', () => {
    const clean = impedance('r-zarc', randles, frequencyHz);
    const g = gaussian(7);
    const noisy: Spectrum = { frequencyHz, re: clean.re.map((v) => v * (1 + 0.005 * g())), im: clean.im.map((v) => v * (1 + 0.005 * g())) };
    const result = linearKramersKronig(noisy);
    // REFERENCES.md Behaviour: μ search stops at M = 18 (μ 0.74), max ≈ 1.1 % — our noise draw differs.
    expect(result.elements).toBeGreaterThanOrEqual(14);
    expect(result.elements).toBeLessThanOrEqual(24);
    expect(result.maxAbsResidualPct).toBeGreaterThan(0.5);
    expect(result.maxAbsResidualPct).toBeLessThan(2);
    // Noise estimate √(5000·χ²/N) (REFERENCES.md) is below the 0.5 % put in: the fit absorbs part of it.
    expect(result.noiseEstimatePct).toBeGreaterThan(0.2);
    expect(result.noiseEstimatePct).toBeLessThan(0.5);
  });

  it('fails the same spectrum when R rises 10 % during the sweep, with systematic residuals', () => {
    // The sweep runs from 100 kHz down; each point lasts max(one period, 50 ms) and R rises linearly
    // with elapsed time — our timing model, since the reference does not state one.
    const duration = Array.from(frequencyHz, (f) => Math.max(1 / f, 0.05));
    const total = duration.reduce((a, b) => a + b, 0);
    const re = new Float64Array(N);
    const im = new Float64Array(N);
    let elapsed = 0;
    for (let i = N - 1; i >= 0; i--) {
      elapsed += duration[i];
      const z = impedance('r-zarc', { ...randles, r: 100 * (1 + (0.1 * elapsed) / total) }, frequencyHz.subarray(i, i + 1));
      re[i] = z.re[0];
      im[i] = z.im[0];
    }
    const result = linearKramersKronig({ frequencyHz, re, im });
    expect(result.passed).toBe(false);
    // REFERENCES.md Behaviour: systematic residuals of 1.7–2.4 %; our drift is weighted to the slow end.
    expect(result.maxAbsResidualPct).toBeGreaterThan(1.5);
    expect(result.maxAbsResidualPct).toBeLessThan(5);
    // Systematic, not noise: neighbouring real residuals move together (lag-1 autocorrelation).
    const r = result.residualsRePct;
    let num = 0;
    let den = 0;
    for (let i = 0; i < N; i++) {
      den += r[i] * r[i];
      if (i > 0) num += r[i] * r[i - 1];
    }
    expect(num / den).toBeGreaterThan(0.5);
  });

  it('does not fail noise-free data from one ideal RC element (the μ pitfall of REFERENCES.md)', () => {
    const rc = impedance('r-zarc', { rs: 0, r: 100, q: 1e-5, n: 1 }, frequencyHz);
    expect(linearKramersKronig(rc, { elements: 4 }).maxAbsResidualPct).toBeGreaterThan(10); // the pitfall itself
    const result = linearKramersKronig(rc);
    expect(result.passed).toBe(true);
    expect(result.maxAbsResidualPct).toBeLessThan(0.1);
  });
});
