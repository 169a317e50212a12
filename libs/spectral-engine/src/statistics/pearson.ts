import { assertFiniteValues } from './finite-values';
import { regularisedIncompleteBeta } from './incomplete-beta';

/** Pearson correlation with its two-sided p-value and the number of pairs. */
export interface PearsonResult {
  /** Correlation coefficient, dimensionless, in [−1, 1]. */
  readonly r: number;
  /** Two-sided p-value of the t-test of r = 0 with n − 2 degrees of freedom. */
  readonly p: number;
  readonly n: number;
}

function centred(values: ArrayLike<number>): Float64Array {
  let sum = 0;
  for (let i = 0; i < values.length; i++) sum += values[i];
  const m = sum / values.length;
  const out = new Float64Array(values.length);
  for (let i = 0; i < values.length; i++) out[i] = values[i] - m;
  return out;
}

function norm(values: Float64Array): number {
  let sum = 0;
  for (let i = 0; i < values.length; i++) sum += values[i] * values[i];
  return Math.sqrt(sum);
}

/**
 * Pearson product-moment correlation of paired finite values (any units; r is dimensionless)
 * with the two-sided p-value of t = r·√((n−2)/(1−r²)), computed as SciPy's `pearsonr` does through
 * the equivalent beta distribution: p = 2·I_{(1−|r|)/2}(n/2 − 1, n/2 − 1).
 * Needs at least two pairs (two pairs give |r| = 1 and p = 1, as SciPy); a constant series has
 * no correlation and is an error.
 */
export function pearson(x: ArrayLike<number>, y: ArrayLike<number>): PearsonResult {
  if (x.length !== y.length) throw new RangeError(`pearson: x has ${x.length} values and y has ${y.length}; they must pair up`);
  const n = x.length;
  if (n < 2) throw new RangeError(`pearson: needs at least two pairs, got ${n}`);
  assertFiniteValues(x, 'x', 'pearson');
  assertFiniteValues(y, 'y', 'pearson');
  const xc = centred(x);
  const yc = centred(y);
  const nx = norm(xc);
  const ny = norm(yc);
  if (nx === 0 || ny === 0) {
    throw new RangeError(`pearson: ${nx === 0 ? 'x' : 'y'} is constant, so the correlation is undefined`);
  }
  let dot = 0;
  for (let i = 0; i < n; i++) dot += (xc[i] / nx) * (yc[i] / ny);
  const r = Math.max(-1, Math.min(1, dot));
  // Two points always lie on a line; SciPy returns the exact sign rather than a rounded ±0.9999….
  if (n === 2) return { r: Math.sign(x[1] - x[0]) * Math.sign(y[1] - y[0]), p: 1, n };
  const halfDf = n / 2 - 1;
  const p = Math.min(1, 2 * regularisedIncompleteBeta(halfDf, halfDf, (1 - Math.abs(r)) / 2));
  return { r, p, n };
}
