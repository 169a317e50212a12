import normalQuantile from '@stdlib/stats-base-dists-normal-quantile';
import { assertFiniteValues } from '../statistics/finite-values';

/** A two-parameter lognormal distribution: ln X ~ Normal(mu, sigma²). */
export interface LognormalFit {
  /** Mean of ln X (ln of the distance unit). SciPy's `scale` is exp(mu). */
  readonly mu: number;
  /** Standard deviation of ln X (dimensionless). SciPy's shape `s`. */
  readonly sigma: number;
}

/**
 * Maximum-likelihood fit of a lognormal with its location fixed at zero — what
 * `scipy.stats.lognorm.fit(x, floc=0)` computes: mu is the mean of ln x and sigma the
 * standard deviation of ln x with divisor n (not n − 1). Closed form, so it cannot fail to
 * converge. Every value must be finite and above zero.
 */
export function fitLognormal(values: ArrayLike<number>): LognormalFit {
  assertFiniteValues(values, 'values', 'fitLognormal');
  const n = values.length;
  if (n < 2) throw new RangeError(`fitLognormal: needs at least two values, got ${n}`);
  let sum = 0;
  for (let i = 0; i < n; i++) {
    if (!(values[i] > 0)) throw new RangeError(`fitLognormal: values[${i}] is ${values[i]}; a lognormal needs values above zero`);
    sum += Math.log(values[i]);
  }
  const mu = sum / n;
  let squares = 0;
  for (let i = 0; i < n; i++) squares += (Math.log(values[i]) - mu) ** 2;
  return { mu, sigma: Math.sqrt(squares / n) };
}

/**
 * The p-quantile (0 < p < 1) of a lognormal, exp(mu + sigma·Φ⁻¹(p)), in the unit of the fitted
 * values — `scipy.stats.lognorm.ppf(p, s=sigma, scale=exp(mu))`. Φ⁻¹ is stdlib's normal quantile.
 */
export function lognormalQuantile(p: number, fit: LognormalFit): number {
  if (!(p > 0 && p < 1)) throw new RangeError(`lognormalQuantile: probability ${p} must lie strictly between 0 and 1`);
  if (fit.sigma === 0) return Math.exp(fit.mu);
  return Math.exp(normalQuantile(p, fit.mu, fit.sigma));
}
