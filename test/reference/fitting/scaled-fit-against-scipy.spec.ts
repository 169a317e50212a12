import { fitModel, type Spectrum } from '@ohmprint/spectral-engine';
import fixture from '../fixtures/fitting-scaled/scaled-fits.json';

// Source: SciPy's least_squares (method 'trf') on the same objective in log-parameters
// (test/reference/fixtures/fitting-scaled/generate.py, versions in the fixture's "source").
// Randles cells with a CPE and a Warburg element whose parameters span many decades; modulus
// weighting; χ² = Σ((Z − Ẑ)/|Z|)² over real and imaginary parts, as our fitter's chiSquare.

interface ScipyFit {
  readonly parameters: Record<string, number | null>;
  readonly chiSquare: number;
}
interface Case {
  readonly frequencyHz: number[];
  readonly re: number[];
  readonly im: number[];
  readonly truth: Record<string, number>;
  readonly bestChiSquare: number;
}
const wide = fixture.wide as unknown as Case & { readonly starts: Record<string, number>[]; readonly scipy: (ScipyFit | null)[] };
const noisy = fixture.noisy as unknown as (Case & { readonly start: Record<string, number>; readonly scipy: ScipyFit | null })[];

const spectrum = (c: Case): Spectrum => ({ frequencyHz: Float64Array.from(c.frequencyHz), re: Float64Array.from(c.re), im: Float64Array.from(c.im) });
/** The best known minimum, to rounding: the lowest χ² SciPy reached from any start. */
const reaches = (chiSquare: number | null, best: number): boolean => chiSquare !== null && chiSquare <= best * (1 + 1e-6);

describe('scaled fitting against scipy.optimize.least_squares in log-parameters', () => {
  it('fits a Randles-CPE-Warburg spectrum whose parameters span twelve decades, with finite standard errors', () => {
    const s = spectrum(wide);
    const fit = fitModel(s, 'randles-cpe', { initial: wide.truth });
    if (!fit.converged) throw new Error(fit.reason);
    expect(fit.chiSquare).toBeLessThanOrEqual(wide.bestChiSquare * (1 + 1e-6));
    for (const name of fit.parameterNames) {
      // Standard errors in the parameter's own units: finite, and small beside the value.
      expect({ name, finite: Number.isFinite(fit.standardErrors[name]) && fit.standardErrors[name] > 0 }).toEqual({ name, finite: true });
      expect(fit.standardErrors[name]).toBeLessThan(0.1 * fit.parameters[name]);
    }
    // From every one of SciPy's starts (spread over up to e^±2 per parameter) we reach its best minimum at least as often.
    const ours = wide.starts.filter((start) => {
      const r = fitModel(s, 'randles-cpe', { initial: start });
      return r.converged && reaches(r.chiSquare, wide.bestChiSquare);
    }).length;
    const theirs = wide.scipy.filter((r) => r !== null && reaches(r.chiSquare, wide.bestChiSquare)).length;
    expect(ours).toBeGreaterThanOrEqual(theirs);
  }, 120_000);

  it('reaches the best known minimum on 100 noisy sets at least as often as SciPy from the same starts', () => {
    let ours = 0;
    let theirs = 0;
    for (const c of noisy) {
      // Our fitter as the product runs it: the given start, then its own restarts around it.
      const r = fitModel(spectrum(c), 'randles-cpe', { initial: c.start });
      if (r.converged && reaches(r.chiSquare, c.bestChiSquare)) ours++;
      if (c.scipy && reaches(c.scipy.chiSquare, c.bestChiSquare)) theirs++;
    }
    expect(theirs).toBeGreaterThan(50); // the fixture is a real contest, not a trivial one
    expect(ours).toBeGreaterThanOrEqual(theirs);
  }, 300_000);
});
