import { impedance } from '../models/impedance';
import { fitModel } from './fit-model';
import { guessParameters } from './starting-point';

const f = Float64Array.from({ length: 40 }, (_, i) => 10 ** (-1 + (6 * i) / 39));

describe('fitModel', () => {
  it('recovers every built-in model from its own clean spectrum using only automatic starts', () => {
    const cases: [string, Record<string, number>][] = [
      ['cpe', { q: 2e-6, n: 0.83 }],
      ['r-cpe', { r: 40, q: 5e-6, n: 0.9 }],
      ['r-zarc', { rs: 15, r: 300, q: 2e-5, n: 0.85 }],
      ['cole-cole', { rInf: 80, r0: 1200, tau: 3e-4, alpha: 0.72 }],
      ['havriliak-negami', { rInf: 30, r0: 500, tau: 1e-4, alpha: 0.8, beta: 0.7 }],
      ['warburg', { sigma: 75 }],
      ['warburg-finite-length', { z0: 120, tau: 0.4 }],
      ['warburg-finite-space', { z0: 120, tau: 0.4 }],
      ['randles-cpe', { rs: 12, rct: 180, q: 3e-5, n: 0.9, sigma: 45 }],
    ];
    for (const [model, truth] of cases) {
      const fit = fitModel(impedance(model, truth, f), model);
      expect({ model, converged: fit.converged }).toEqual({ model, converged: true });
      if (!fit.converged) continue;
      for (const [name, value] of Object.entries(truth)) expect({ model, name, error: Math.abs(fit.parameters[name] / value - 1) < 1e-5 }).toEqual({ model, name, error: true });
    }
  });

  it('keeps parameters inside their bounds and can land on one', () => {
    // An ideal capacitor: the CPE exponent belongs exactly on its upper bound of 1.
    const fit = fitModel(impedance('r-cpe', { r: 10, q: 1e-6, n: 1 }, f), 'r-cpe');
    expect(fit.converged).toBe(true);
    if (fit.converged) expect(fit.parameters['n']).toBeCloseTo(1, 6);
    const bounded = fitModel(impedance('r-cpe', { r: 10, q: 1e-6, n: 0.95 }, f), 'r-cpe', { bounds: { n: { lower: 0, upper: 0.9 } } });
    if (bounded.converged) expect(bounded.parameters['n']).toBeLessThanOrEqual(0.9);
    else throw new Error(bounded.reason);
  });

  it('identifies parameters many decades apart: a CPE magnitude near 1e−9 beside resistances near 1e3', () => {
    const truth = { rs: 850, rct: 2400, q: 1.3e-9, n: 0.88, sigma: 9000 };
    const wide = Float64Array.from({ length: 50 }, (_, i) => 10 ** (-2 + (8 * i) / 49));
    const clean = impedance('randles-cpe', truth, wide);
    // 0.3 % multiplicative ripple, so the optimum has a χ² above zero and finite standard errors.
    const s = { ...clean, re: clean.re.map((v, i) => v * (1 + 0.003 * Math.sin(1.7 * i))), im: clean.im.map((v, i) => v * (1 + 0.003 * Math.cos(2.3 * i))) };
    for (const initial of [undefined, truth]) {
      const fit = fitModel(s, 'randles-cpe', { initial });
      if (!fit.converged) throw new Error(fit.reason);
      for (const [name, value] of Object.entries(truth)) {
        expect({ name, close: Math.abs(fit.parameters[name] / value - 1) < 0.05 }).toEqual({ name, close: true });
        const se = fit.standardErrors[name];
        // In the parameter's own units: finite, positive, and small beside the value.
        expect({ name, se: Number.isFinite(se) && se > 0 && se < 0.1 * value }).toEqual({ name, se: true });
      }
    }
  });

  it('reaches the optimum when the CPE exponent rests on its bound of 1', () => {
    // Data slightly "more ideal than a capacitor" (n = 1.03 beyond the bound): the bounded optimum has n = 1 exactly.
    const data = impedance('rs + 1/(1/r + q*(j*ω)^n)', { rs: 20, r: 300, q: 4e-6, n: 1.03 }, f);
    const bounded = fitModel(data, 'r-zarc');
    if (!bounded.converged) throw new Error(bounded.reason);
    expect(bounded.parameters['n']).toBe(1);
    // The same spectrum fitted with n fixed at 1 (an ideal capacitor): the χ² the bounded fit must reach.
    const fixed = fitModel(data, 'rs + 1/(1/r + q*j*ω)', { initial: { rs: 20, r: 300, q: 4e-6 } });
    if (!fixed.converged) throw new Error(fixed.reason);
    expect(bounded.chiSquare).toBeLessThanOrEqual(fixed.chiSquare * (1 + 1e-9));
    expect(bounded.parameters['q']).toBeCloseTo(fixed.parameters['q'], 12);
  });

  it('says it did not converge instead of giving numbers when the iterations run out', () => {
    const fit = fitModel(impedance('cole-cole', { rInf: 80, r0: 1200, tau: 3e-4, alpha: 0.72 }, f), 'cole-cole', {
      initial: { rInf: 1, r0: 1, tau: 10, alpha: 0.2 },
      maxIterations: 2,
      restarts: 0,
    });
    expect(fit).toMatchObject({ converged: false, parameters: null, standardErrors: null, reason: 'no convergence within 2 iterations' });
  });

  it('reports parameters it cannot identify rather than an uncertainty of zero or infinity', () => {
    // Two resistors in series cannot be told apart by any spectrum.
    const flat = { frequencyHz: f, re: new Float64Array(f.length).fill(100), im: new Float64Array(f.length).fill(-1e-3) };
    const fit = fitModel(flat, 'a + b + 0*ω');
    expect(fit.converged).toBe(false);
    expect(fit.reason).toMatch(/not identifiable/);
  });

  it('fits a lab-defined expression', () => {
    const truth = { r: 40, q: 5e-6, n: 0.9 };
    const fit = fitModel(impedance('r-cpe', truth, f), 'r + 1/(q*(j*ω)^n)', { initial: { r: 30, q: 1e-5, n: 0.8 } });
    if (!fit.converged) throw new Error(fit.reason);
    expect(fit.parameters['r']).toBeCloseTo(40, 6);
    expect(fit.parameters['n']).toBeCloseTo(0.9, 8);
  });

  it('refuses a spectrum with fewer points than parameters need', () => {
    const two = impedance('randles-cpe', { rs: 1, rct: 1, q: 1, n: 1, sigma: 1 }, Float64Array.of(1, 2));
    expect(() => fitModel(two, 'randles-cpe')).toThrow('fitting 5 parameters needs more than 2.5 frequencies; the spectrum has 2');
  });

  it('starts from the arc it sees: apex frequency and plateaus', () => {
    const g = guessParameters(impedance('cole-cole', { rInf: 80, r0: 1200, tau: 3e-4, alpha: 0.9 }, f), 'cole-cole');
    expect(g['rInf']).toBeGreaterThan(60);
    expect(g['rInf']).toBeLessThan(100);
    expect(g['r0']).toBeGreaterThan(1100);
    expect(Math.abs(Math.log10(g['tau'] / 3e-4))).toBeLessThan(0.2);
  });
});
