import type { Spectrum } from '../spectrum';
import type { ImpedanceModel } from '../models/model-types';
import { resolveModel, type ModelReference } from '../models/resolve-model';
import { angularFrequencies } from '../models/shape-features';
import type { FitFailure, FitResult } from './fit-result';
import { minimise, type MinimiserResult } from './levenberg-marquardt';
import { modelSpaceSlope, searchBox, toModelSpace, toSearchSpace, type Bounds } from './parameter-transform';
import { boundsOf, startingPoint, type FitOptions } from './starting-point';
import { scaledCovariance } from './scaled-covariance';
import { inverseSigmas, type Weighting } from './weighting';

const TOLERANCES = { ftol: 1e-12, xtol: 1e-10, gtol: 1e-12 };

/**
 * Deterministic perturbation of the search point for restart k: about ×e for a log-parameter, a
 * fifth of the range for a two-sided one (reflected back into its bounds), half the value otherwise.
 */
function perturbed(u: Float64Array, bounds: Bounds[], k: number): Float64Array {
  return Float64Array.from(u, (x, j) => {
    const sign = ((k >> j % 3) + j) % 2 === 0 ? 1 : -1;
    const { lower, upper } = bounds[j];
    const grow = 1 + 0.25 * Math.floor(k / 2);
    if (Number.isFinite(lower) && Number.isFinite(upper)) {
      const moved = x + sign * 0.2 * (upper - lower) * grow;
      const inside = moved > upper ? 2 * upper - moved : moved < lower ? 2 * lower - moved : moved;
      return Math.min(upper, Math.max(lower, inside));
    }
    const size = Number.isFinite(lower) || Number.isFinite(upper) ? 1 : 0.5 * Math.max(Math.abs(x), 1);
    return x + sign * size * grow;
  });
}

function failure(model: ImpedanceModel, weighting: Weighting, result: Pick<MinimiserResult, 'iterations' | 'reason'>): FitFailure {
  return {
    converged: false,
    model: model.name,
    weighting,
    parameterNames: model.parameters.map((p) => p.name),
    parameters: null,
    standardErrors: null,
    chiSquare: null,
    residualPct: null,
    iterations: result.iterations,
    reason: result.reason,
  };
}

/**
 * Complex nonlinear least-squares fit of a model to a spectrum: real and imaginary residuals
 * stacked and weighted, Levenberg–Marquardt on bounded parameters (by reparametrisation), starts
 * from the spectrum's shape plus a few restarts, standard errors from the Jacobian at the optimum
 * (as SciPy's curve_fit with absolute_sigma=False).
 * @param s spectrum, frequencies in Hz, impedance in Ω
 * @param model built-in name, lab-defined expression in ω and j, or a defined model
 * @returns parameters in the catalog's units, or `converged: false` with the reason
 */
export function fitModel(s: Spectrum, model: ModelReference, options: FitOptions = {}): FitResult {
  const m = resolveModel(model);
  const weighting = options.weighting ?? 'modulus';
  const n = s.frequencyHz.length;
  const p = m.parameters.length;
  if (s.re.length !== n || s.im.length !== n) throw new RangeError('spectrum arrays differ in length');
  if (2 * n <= p) throw new RangeError(`fitting ${p} parameters needs more than ${p / 2} frequencies; the spectrum has ${n}`);
  const bounds = boundsOf(m, options);
  const omega = angularFrequencies(s.frequencyHz);
  const w = inverseSigmas(s, weighting);
  for (let i = 0; i < 2 * n; i++) {
    if (!Number.isFinite(w[i])) return failure(m, weighting, { iterations: 0, reason: `impedance at ${s.frequencyHz[i % n]} Hz is zero or not finite: cannot weight it` });
  }
  const re = new Float64Array(n);
  const im = new Float64Array(n);
  const values = new Float64Array(p);

  const weightedResidual = (pv: Float64Array, out: Float64Array): boolean => {
    m.evaluate(pv, omega, re, im);
    for (let i = 0; i < n; i++) {
      const a = (s.re[i] - re[i]) * w[i];
      const b = (s.im[i] - im[i]) * w[n + i];
      if (!Number.isFinite(a) || !Number.isFinite(b)) return false;
      out[i] = a;
      out[n + i] = b;
    }
    return true;
  };
  const inSearchSpace = (u: Float64Array, out: Float64Array): boolean => {
    for (let j = 0; j < p; j++) values[j] = toModelSpace(u[j], bounds[j]);
    return weightedResidual(values, out);
  };

  const derivatives = m.derivatives?.bind(m);
  const dRe = new Float64Array(n * p);
  const dIm = new Float64Array(n * p);
  const searchJacobian = derivatives
    ? (u: Float64Array, jac: Float64Array): boolean => {
        for (let j = 0; j < p; j++) values[j] = toModelSpace(u[j], bounds[j]);
        derivatives(values, omega, re, im, dRe, dIm);
        for (let j = 0; j < p; j++) {
          const slope = -modelSpaceSlope(u[j], bounds[j]);
          const col = j * 2 * n;
          for (let i = 0; i < n; i++) {
            const a = dRe[j * n + i] * w[i] * slope;
            const b = dIm[j * n + i] * w[n + i] * slope;
            if (!Number.isFinite(a) || !Number.isFinite(b)) return false;
            jac[col + i] = a;
            jac[col + n + i] = b;
          }
        }
        return true;
      }
    : undefined;

  const start = startingPoint(m, s, bounds, options);
  const u0 = Float64Array.from(start, (v, j) => toSearchSpace(v, bounds[j]));
  const minimiserOptions = { maxIterations: options.maxIterations ?? 200, ...TOLERANCES };
  const box = searchBox(bounds);
  // Costs this close to zero differ only by rounding: 1e−20 of the cost of predicting Z = 0.
  let costFloor = 0;
  for (let i = 0; i < n; i++) costFloor += (s.re[i] * w[i]) ** 2 + (s.im[i] * w[n + i]) ** 2;
  costFloor *= 1e-20;
  const first = minimise(inSearchSpace, u0, 2 * n, minimiserOptions, searchJacobian, box);
  let best: MinimiserResult | null = first.converged ? first : null;
  // Restarts stop once a second start lands on the best minimum found: that minimum is then confirmed.
  for (let k = 0; k < (options.restarts ?? 3); k++) {
    const run = minimise(inSearchSpace, perturbed(u0, bounds, k), 2 * n, minimiserOptions, searchJacobian, box);
    if (!run.converged || !Number.isFinite(run.cost)) continue;
    if (best && Math.abs(run.cost - best.cost) <= 1e-7 * best.cost + costFloor) break;
    if (!best || run.cost < best.cost) best = run;
  }
  if (!best) return failure(m, weighting, first);

  const fitted = Float64Array.from(best.u, (x, j) => toModelSpace(x, bounds[j]));
  const covariance = covarianceAt(fitted, bounds, weightedResidual, 2 * n, best.cost);
  if (!covariance) return failure(m, weighting, { iterations: best.iterations, reason: 'the parameters are not identifiable from this spectrum (singular Jacobian at the optimum, after scaling each parameter)' });

  m.evaluate(fitted, omega, re, im);
  const residualsRePct = new Float64Array(n);
  const residualsImPct = new Float64Array(n);
  let sumSq = 0;
  let maxAbs = 0;
  for (let i = 0; i < n; i++) {
    const modulus = Math.hypot(s.re[i], s.im[i]);
    residualsRePct[i] = (100 * (s.re[i] - re[i])) / modulus;
    residualsImPct[i] = (100 * (s.im[i] - im[i])) / modulus;
    sumSq += residualsRePct[i] ** 2 + residualsImPct[i] ** 2;
    maxAbs = Math.max(maxAbs, Math.abs(residualsRePct[i]), Math.abs(residualsImPct[i]));
  }
  const names = m.parameters.map((q) => q.name);
  const dof = 2 * n - p;
  return {
    converged: true,
    model: m.name,
    weighting,
    parameterNames: names,
    parameters: Object.fromEntries(names.map((name, j) => [name, fitted[j]])),
    standardErrors: Object.fromEntries(names.map((name, j) => [name, Math.sqrt(covariance[j * p + j])])),
    covariance: names.map((_, r) => Array.from(covariance.subarray(r * p, (r + 1) * p))),
    chiSquare: best.cost,
    reducedChiSquare: best.cost / dof,
    degreesOfFreedom: dof,
    residualPct: Math.sqrt(sumSq / (2 * n)),
    maxAbsResidualPct: maxAbs,
    residualsRePct,
    residualsImPct,
    iterations: best.iterations,
    reason: best.reason,
  };
}

/**
 * s²(JᵀJ)⁻¹ with J taken in the model's own parameters by central differences (one-sided at a
 * bound), so the uncertainties do not depend on the search space and stay in the parameters' units.
 * Identifiability is judged on the column-scaled problem (see scaledCovariance), so parameters
 * many decades apart (a CPE magnitude of 1e−9 beside resistances of 1e3) are not mistaken for
 * dependent ones.
 */
function covarianceAt(
  p: Float64Array,
  bounds: Bounds[],
  residual: (pv: Float64Array, out: Float64Array) => boolean,
  rows: number,
  cost: number,
): Float64Array | null {
  const k = p.length;
  const jac = new Float64Array(rows * k);
  const plus = new Float64Array(rows);
  const minus = new Float64Array(rows);
  const probe = new Float64Array(k);
  for (let j = 0; j < k; j++) {
    const h = Math.cbrt(Number.EPSILON) * Math.max(Math.abs(p[j]), 1e-300);
    const up = Math.min(p[j] + h, bounds[j].upper);
    const down = Math.max(p[j] - h, bounds[j].lower);
    probe.set(p);
    probe[j] = up;
    if (!residual(probe, plus)) return null;
    probe[j] = down;
    if (!residual(probe, minus)) return null;
    for (let i = 0; i < rows; i++) jac[j * rows + i] = (plus[i] - minus[i]) / (up - down);
  }
  return scaledCovariance(jac, rows, k, cost / (rows - k));
}
