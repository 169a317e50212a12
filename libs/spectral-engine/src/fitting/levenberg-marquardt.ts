import { cholesky, choleskySolve } from './symmetric-solve';

/** Writes the residual vector for the search point u; returns false if any value is not finite. */
export type ResidualFunction = (u: Float64Array, out: Float64Array) => boolean;

/** Writes ∂r/∂u column by column (column j at offset j·rows); returns false if any value is not finite. */
export type JacobianFunction = (u: Float64Array, jac: Float64Array) => boolean;

export interface MinimiserOptions {
  /** Outer iterations (Jacobian evaluations) before giving up. */
  readonly maxIterations: number;
  /** Stop when an accepted step lowers the cost by less than this fraction. */
  readonly ftol: number;
  /** Stop when the step is smaller than this fraction of the point. */
  readonly xtol: number;
  /** Stop when the largest gradient component (scaled by the cost) is below this. */
  readonly gtol: number;
}

export interface MinimiserResult {
  readonly u: Float64Array;
  /** Σ r², the weighted sum of squares at u. */
  readonly cost: number;
  readonly iterations: number;
  readonly converged: boolean;
  readonly reason: string;
}

const SQRT_EPS = Math.sqrt(Number.EPSILON);

function sumOfSquares(r: Float64Array): number {
  let s = 0;
  for (let i = 0; i < r.length; i++) s += r[i] * r[i];
  return s;
}

/** Inclusive limits on u, ±Infinity where there is none. */
export interface SearchBox {
  readonly lower: Float64Array;
  readonly upper: Float64Array;
}

/**
 * Levenberg–Marquardt with Marquardt's diagonal scaling (which makes the step independent of each
 * column's scale) and Nielsen's damping update, on the given Jacobian or else a forward-difference
 * one. Box limits are kept by an active set: a coordinate on its limit whose gradient points out of
 * the box is held there and the step solved for the others; trial points are projected into the
 * box. So a parameter whose optimum lies on a bound reaches it exactly and the rest still converge.
 * Column-major storage keeps each Jacobian column contiguous.
 */
export function minimise(
  residual: ResidualFunction,
  u0: Float64Array,
  rows: number,
  options: MinimiserOptions,
  jacobian?: JacobianFunction,
  box?: SearchBox,
): MinimiserResult {
  const p = u0.length;
  const lo = box?.lower ?? new Float64Array(p).fill(-Infinity);
  const hi = box?.upper ?? new Float64Array(p).fill(Infinity);
  const u = Float64Array.from(u0, (x, j) => Math.min(hi[j], Math.max(lo[j], x)));
  const held = new Uint8Array(p);
  const trial = new Float64Array(p);
  const r = new Float64Array(rows);
  const rTrial = new Float64Array(rows);
  const jac = new Float64Array(rows * p);
  const a = new Float64Array(p * p);
  const damped = new Float64Array(p * p);
  const factor = new Float64Array(p * p);
  const g = new Float64Array(p);
  const negG = new Float64Array(p);
  const step = new Float64Array(p);
  const diag = new Float64Array(p);

  if (!residual(u, r)) return { u, cost: NaN, iterations: 0, converged: false, reason: 'the model gives non-finite impedance at the starting point' };
  let cost = sumOfSquares(r);
  let lambda = -1;
  let nu = 2;

  for (let iteration = 1; iteration <= options.maxIterations; iteration++) {
    if (jacobian) {
      if (!jacobian(u, jac)) return { u, cost, iterations: iteration, converged: false, reason: 'the model gives non-finite derivatives near the current parameters' };
    }
    for (let j = 0; j < p && !jacobian; j++) {
      // Step into the box: a coordinate on its upper limit is differenced backwards.
      const h = (u[j] + SQRT_EPS * Math.max(Math.abs(u[j]), 1) > hi[j] ? -1 : 1) * SQRT_EPS * Math.max(Math.abs(u[j]), 1);
      trial.set(u);
      trial[j] += h;
      const column = jac.subarray(j * rows, (j + 1) * rows);
      if (!residual(trial, column)) {
        trial[j] = u[j] - h;
        if (!residual(trial, column)) return { u, cost, iterations: iteration, converged: false, reason: 'the model gives non-finite impedance near the current parameters' };
        for (let i = 0; i < rows; i++) column[i] = (r[i] - column[i]) / h;
      } else {
        for (let i = 0; i < rows; i++) column[i] = (column[i] - r[i]) / h;
      }
    }
    let gMax = 0;
    let aMax = 0;
    for (let j = 0; j < p; j++) {
      const cj = jac.subarray(j * rows, (j + 1) * rows);
      for (let k = 0; k <= j; k++) {
        const ck = jac.subarray(k * rows, (k + 1) * rows);
        let s = 0;
        for (let i = 0; i < rows; i++) s += cj[i] * ck[i];
        a[j * p + k] = s;
        a[k * p + j] = s;
      }
      let s = 0;
      for (let i = 0; i < rows; i++) s += cj[i] * r[i];
      g[j] = s;
      aMax = Math.max(aMax, a[j * p + j]);
    }
    // The active set: coordinates on a limit that the descent direction −g would push out of the box.
    for (let j = 0; j < p; j++) {
      held[j] = (u[j] <= lo[j] && g[j] > 0) || (u[j] >= hi[j] && g[j] < 0) ? 1 : 0;
      negG[j] = held[j] ? 0 : -g[j];
      if (!held[j]) gMax = Math.max(gMax, Math.abs(g[j]));
    }
    if (gMax <= options.gtol * Math.max(cost, Number.MIN_VALUE) || cost === 0) {
      return { u, cost, iterations: iteration, converged: true, reason: 'gradient vanished' };
    }
    for (let j = 0; j < p; j++) diag[j] = Math.max(a[j * p + j], 1e-12 * aMax, Number.MIN_VALUE);
    if (lambda < 0) lambda = 1e-3;

    let accepted = false;
    while (!accepted) {
      damped.set(a);
      for (let j = 0; j < p; j++) {
        damped[j * p + j] += lambda * diag[j];
        if (!held[j]) continue;
        for (let k = 0; k < p; k++) {
          damped[j * p + k] = 0;
          damped[k * p + j] = 0;
        }
        damped[j * p + j] = 1;
      }
      if (!cholesky(damped, p, factor)) {
        lambda *= nu;
        nu *= 2;
        if (lambda > 1e16) return { u, cost, iterations: iteration, converged: false, reason: 'the normal equations are singular: parameters are not identifiable from this spectrum' };
        continue;
      }
      choleskySolve(factor, p, negG, step);
      let stepNorm = 0;
      let uNorm = 0;
      for (let j = 0; j < p; j++) {
        trial[j] = Math.min(hi[j], Math.max(lo[j], u[j] + step[j]));
        // The step actually taken, after projection into the box.
        step[j] = trial[j] - u[j];
        stepNorm += step[j] * step[j];
        uNorm += u[j] * u[j];
      }
      if (Math.sqrt(stepNorm) <= options.xtol * (Math.sqrt(uNorm) + options.xtol)) {
        return { u, cost, iterations: iteration, converged: true, reason: 'step below tolerance' };
      }
      const finite = residual(trial, rTrial);
      const trialCost = finite ? sumOfSquares(rTrial) : Infinity;
      // Reduction the linear model predicts for the step taken: −2gᵀs − sᵀAs (equal to sᵀ(λDs − g) for an unprojected step).
      let predicted = 0;
      for (let j = 0; j < p; j++) {
        let as = 0;
        for (let k = 0; k < p; k++) as += a[j * p + k] * step[k];
        predicted -= 2 * g[j] * step[j] + step[j] * as;
      }
      const rho = predicted > 0 ? (cost - trialCost) / predicted : -1;
      if (finite && rho > 0) {
        const drop = cost - trialCost;
        u.set(trial);
        r.set(rTrial);
        cost = trialCost;
        lambda *= Math.max(1 / 3, 1 - Math.pow(2 * rho - 1, 3));
        nu = 2;
        accepted = true;
        if (drop <= options.ftol * cost) return { u, cost, iterations: iteration, converged: true, reason: 'cost change below tolerance' };
      } else {
        lambda *= nu;
        nu *= 2;
        if (lambda > 1e16) return { u, cost, iterations: iteration, converged: true, reason: 'no downhill step remains' };
      }
    }
  }
  return { u, cost, iterations: options.maxIterations, converged: false, reason: `no convergence within ${options.maxIterations} iterations` };
}
