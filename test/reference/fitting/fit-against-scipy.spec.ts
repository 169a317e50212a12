import { fitModel, type FitSuccess, type Weighting } from '@ohmprint/spectral-engine';
import fixture from '../fixtures/fitting/fits.json';

interface ScipyCase {
  readonly label: string;
  readonly model: string;
  readonly weighting: Weighting;
  readonly frequencyHz: number[];
  readonly re: number[];
  readonly im: number[];
  readonly truth: Record<string, number>;
  readonly parameters: Record<string, number>;
  readonly standardErrors: Record<string, number>;
  readonly chiSquare: number;
}
// JSON imports type every optional key as possibly undefined; the generator writes each case whole.
const cases = fixture.cases as unknown as ScipyCase[];

function success(result: ReturnType<typeof fitModel>): FitSuccess {
  if (!result.converged) throw new Error(`fit did not converge: ${result.reason}`);
  return result;
}

const relative = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

describe('fitModel against scipy.optimize.least_squares', () => {
  it('reproduces the worked case of REFERENCES.md', () => {
    // f = 10^(5−0.2k), k = 0…30; Rs=20 + ZARC(R=100, Q=1e−4, n=0.8), parts perturbed by 0.5 % sin/cos patterns.
    const n = 31;
    const f = new Float64Array(n);
    const re = new Float64Array(n);
    const im = new Float64Array(n);
    for (let k = 0; k < n; k++) {
      const i = n - 1 - k;
      f[i] = 10 ** (5 - 0.2 * k);
      const w = 2 * Math.PI * f[i];
      const c = 100 * 1e-4 * w ** 0.8;
      const dr = 1 + c * Math.cos(0.4 * Math.PI);
      const di = c * Math.sin(0.4 * Math.PI);
      const zr = 20 + (100 * dr) / (dr * dr + di * di);
      const zi = (-100 * di) / (dr * dr + di * di);
      re[i] = zr * (1 + 0.005 * Math.sin(1.7 * k));
      im[i] = zi * (1 + 0.005 * Math.cos(2.3 * k));
    }
    const fit = success(fitModel({ frequencyHz: f, re, im }, 'r-zarc', { initial: { rs: 10, r: 50, q: 1e-5, n: 0.7 } }));
    // SciPy least_squares values from REFERENCES.md "Fitting" [computed], to its printed digits;
    // SciPy's default tolerances stop within about 1e−7 of the optimum, hence 1e−6.
    expect(relative(fit.parameters['rs'], 20.004521746)).toBeLessThan(1e-6);
    expect(relative(fit.parameters['r'], 99.989884239)).toBeLessThan(1e-6);
    expect(relative(fit.parameters['q'], 9.9946512215e-5)).toBeLessThan(1e-6);
    expect(relative(fit.parameters['n'], 0.80010141519)).toBeLessThan(1e-6);
    // Standard errors: SciPy's came from a forward-difference Jacobian, ours from central differences.
    expect(relative(fit.standardErrors['rs'], 0.017750905)).toBeLessThan(1e-3);
    expect(relative(fit.standardErrors['r'], 0.10060494)).toBeLessThan(1e-3);
    expect(relative(fit.standardErrors['q'], 6.6286198e-7)).toBeLessThan(1e-3);
    expect(relative(fit.standardErrors['n'], 9.5617804e-4)).toBeLessThan(1e-3);
    expect(relative(fit.chiSquare, 3.808534092e-4)).toBeLessThan(1e-9); // REFERENCES.md, χ² = Σ r²
  });

  // Cases from fixtures/fitting/generate.py: SciPy least_squares (MINPACK lm, tolerances 1e−15),
  // standard errors s²(JᵀJ)⁻¹ from a central-difference Jacobian at the optimum.
  it.each(cases.map((c) => [c.label, c] as const))('matches SciPy on the %s', (_label, c) => {
    const spectrum = { frequencyHz: Float64Array.from(c.frequencyHz), re: Float64Array.from(c.re), im: Float64Array.from(c.im) };
    const fit = success(fitModel(spectrum, c.model, { weighting: c.weighting }));
    for (const [name, value] of Object.entries(c.parameters)) {
      expect(relative(fit.parameters[name], value)).toBeLessThan(1e-6); // SciPy least_squares, fits.json
      expect(relative(fit.standardErrors[name], c.standardErrors[name])).toBeLessThan(1e-3); // SciPy, fits.json
    }
    expect(relative(fit.chiSquare, c.chiSquare)).toBeLessThan(1e-8); // SciPy least_squares, fits.json
  });

  it('recovers the generating parameters of a clean synthetic spectrum from automatic starting values', () => {
    const c = cases.find((x) => x.model === 'havriliak-negami')!;
    const f = Float64Array.from(c.frequencyHz);
    const truth = c.truth as { rInf: number; r0: number; tau: number; alpha: number; beta: number };
    const w = (x: number) => 2 * Math.PI * x;
    // Clean data built from the same closed form as models.json (numpy): Z = R∞ + ΔR/(1+(jωτ)^α)^β.
    const re = new Float64Array(f.length);
    const im = new Float64Array(f.length);
    f.forEach((x, i) => {
      const m = (w(x) * truth.tau) ** truth.alpha;
      const dr = 1 + m * Math.cos((truth.alpha * Math.PI) / 2);
      const di = m * Math.sin((truth.alpha * Math.PI) / 2);
      const mod = Math.hypot(dr, di) ** -truth.beta;
      const ang = -truth.beta * Math.atan2(di, dr);
      re[i] = truth.rInf + (truth.r0 - truth.rInf) * mod * Math.cos(ang);
      im[i] = (truth.r0 - truth.rInf) * mod * Math.sin(ang);
    });
    const fit = success(fitModel({ frequencyHz: f, re, im }, 'havriliak-negami'));
    for (const [name, value] of Object.entries(truth)) expect(relative(fit.parameters[name], value)).toBeLessThan(1e-6);
  });
});
