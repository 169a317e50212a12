import { regularisedIncompleteBeta } from '../statistics/incomplete-beta';

/**
 * One-sided exact binomial test, alternative "greater": the probability of `k` or more successes
 * in `n` trials when each succeeds with probability `p`, P(X ≥ k) = I_p(k, n − k + 1)
 * (the regularised incomplete beta function; as SciPy's `binomtest(k, n, p, alternative='greater')`).
 */
export function binomialTestGreater(k: number, n: number, p: number): number {
  if (!Number.isInteger(n) || n < 1) throw new RangeError(`n must be a positive integer, got ${n}`);
  if (!Number.isInteger(k) || k < 0 || k > n) throw new RangeError(`k must be an integer in 0–${n}, got ${k}`);
  if (!(p > 0 && p < 1)) throw new RangeError(`p must lie strictly between 0 and 1, got ${p}`);
  if (k === 0) return 1;
  return Math.min(1, Math.max(0, regularisedIncompleteBeta(k, n - k + 1, p)));
}
