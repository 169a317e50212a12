import { lgamma } from 'mathjs';

const EPSILON = 1e-15;
const TINY = 1e-300;
const MAX_ITERATIONS = 10_000;

/**
 * Continued fraction for the incomplete beta function, evaluated by the modified Lentz method
 * (the classic form in Press et al., Numerical Recipes, §6.4).
 */
function continuedFraction(a: number, b: number, x: number): number {
  const qab = a + b;
  const qap = a + 1;
  const qam = a - 1;
  let c = 1;
  let d = 1 - (qab * x) / qap;
  if (Math.abs(d) < TINY) d = TINY;
  d = 1 / d;
  let h = d;
  for (let m = 1; m <= MAX_ITERATIONS; m++) {
    const m2 = 2 * m;
    let aa = (m * (b - m) * x) / ((qam + m2) * (a + m2));
    d = 1 + aa * d;
    if (Math.abs(d) < TINY) d = TINY;
    c = 1 + aa / c;
    if (Math.abs(c) < TINY) c = TINY;
    d = 1 / d;
    h *= d * c;
    aa = (-(a + m) * (qab + m) * x) / ((a + m2) * (qap + m2));
    d = 1 + aa * d;
    if (Math.abs(d) < TINY) d = TINY;
    c = 1 + aa / c;
    if (Math.abs(c) < TINY) c = TINY;
    d = 1 / d;
    const delta = d * c;
    h *= delta;
    if (Math.abs(delta - 1) < EPSILON) return h;
  }
  throw new RangeError(`incomplete beta: no convergence for a=${a}, b=${b}, x=${x}`);
}

/**
 * Regularised incomplete beta function I_x(a, b) for a, b > 0 and 0 ≤ x ≤ 1 (dimensionless),
 * the same quantity as SciPy's `scipy.special.betainc(a, b, x)`.
 */
export function regularisedIncompleteBeta(a: number, b: number, x: number): number {
  if (!(a > 0 && b > 0)) throw new RangeError(`incomplete beta: a=${a} and b=${b} must be positive`);
  if (!(x >= 0 && x <= 1)) throw new RangeError(`incomplete beta: x=${x} must lie in [0, 1]`);
  if (x === 0 || x === 1) return x;
  const logFront = lgamma(a + b) - lgamma(a) - lgamma(b) + a * Math.log(x) + b * Math.log1p(-x);
  const front = Math.exp(logFront);
  // The fraction converges fast only on one side of the mean; use the symmetry I_x(a,b) = 1 − I_{1−x}(b,a) on the other.
  if (x < (a + 1) / (a + b + 2)) return (front * continuedFraction(a, b, x)) / a;
  return 1 - (front * continuedFraction(b, a, 1 - x)) / b;
}
