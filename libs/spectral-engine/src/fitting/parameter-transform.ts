/*
 * Bounds by reparametrisation: the optimiser works on an unconstrained u, the model sees p.
 * [0, ∞) and [a, ∞) use p = a + e^u, which also makes the step size relative — important for
 * CPE magnitudes of 1e−6 next to resistances of 1e3. Two-sided bounds use p = a + (b − a)(1 + sin u)/2,
 * which can reach either bound exactly (an ideal capacitor has n = 1).
 */

export interface Bounds {
  readonly lower: number;
  readonly upper: number;
}

export function toModelSpace(u: number, b: Bounds): number {
  const lowerFinite = Number.isFinite(b.lower);
  const upperFinite = Number.isFinite(b.upper);
  if (lowerFinite && upperFinite) return b.lower + ((b.upper - b.lower) * (1 + Math.sin(u))) / 2;
  if (lowerFinite) return b.lower + Math.exp(u);
  if (upperFinite) return b.upper - Math.exp(u);
  return u;
}

/** Inverse of toModelSpace; values on or past a one-sided bound are nudged just inside it. */
export function toSearchSpace(p: number, b: Bounds): number {
  const lowerFinite = Number.isFinite(b.lower);
  const upperFinite = Number.isFinite(b.upper);
  if (lowerFinite && upperFinite) {
    const t = (2 * (p - b.lower)) / (b.upper - b.lower) - 1;
    return Math.asin(Math.min(1, Math.max(-1, t)));
  }
  const tiny = 1e-12 * Math.max(1, Math.abs(p));
  if (lowerFinite) return Math.log(Math.max(p - b.lower, tiny));
  if (upperFinite) return Math.log(Math.max(b.upper - p, tiny));
  return p;
}

/** dp/du at u. */
export function modelSpaceSlope(u: number, b: Bounds): number {
  const lowerFinite = Number.isFinite(b.lower);
  const upperFinite = Number.isFinite(b.upper);
  if (lowerFinite && upperFinite) return ((b.upper - b.lower) * Math.cos(u)) / 2;
  if (lowerFinite) return Math.exp(u);
  if (upperFinite) return -Math.exp(u);
  return 1;
}
