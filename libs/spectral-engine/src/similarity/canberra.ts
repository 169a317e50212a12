import { assertFiniteValues } from '../statistics/finite-values';

/**
 * Canberra distance Σ wᵢ·|xᵢ − yᵢ| / (|xᵢ| + |yᵢ|), exactly as SciPy's
 * `scipy.spatial.distance.canberra`: a term with xᵢ = yᵢ = 0 counts 0, negative values are
 * allowed, weights are not normalised. Dimensionless, between 0 and Σwᵢ (n without weights).
 * Unlike SciPy, a NaN or infinite value is an error rather than a dropped term.
 */
export function canberra(x: ArrayLike<number>, y: ArrayLike<number>, weights?: ArrayLike<number>): number {
  if (x.length !== y.length) throw new RangeError(`canberra: x has ${x.length} values and y has ${y.length}; they must be the same length`);
  assertFiniteValues(x, 'x', 'canberra');
  assertFiniteValues(y, 'y', 'canberra');
  if (weights) {
    if (weights.length !== x.length) throw new RangeError(`canberra: ${weights.length} weights for ${x.length} values`);
    for (let i = 0; i < weights.length; i++) {
      if (!(Number.isFinite(weights[i]) && weights[i] >= 0)) {
        throw new RangeError(`canberra: weights[${i}] is ${weights[i]}; weights must be finite and not negative`);
      }
    }
  }
  if (!weights) return canberraUnchecked(x, y);
  let sum = 0;
  for (let i = 0; i < x.length; i++) {
    const denominator = Math.abs(x[i]) + Math.abs(y[i]);
    if (denominator > 0) sum += (weights[i] * Math.abs(x[i] - y[i])) / denominator;
  }
  return sum;
}

/** The unweighted sum for inputs already checked (same length, finite): the inner loop of distance matrices. */
export function canberraUnchecked(x: ArrayLike<number>, y: ArrayLike<number>): number {
  let sum = 0;
  for (let i = 0; i < x.length; i++) {
    const denominator = Math.abs(x[i]) + Math.abs(y[i]);
    if (denominator > 0) sum += Math.abs(x[i] - y[i]) / denominator;
  }
  return sum;
}
