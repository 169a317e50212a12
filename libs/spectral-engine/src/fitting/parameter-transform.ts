/*
 * The search space of the fitter. Parameters with one bound (resistances, CPE magnitudes,
 * time constants: [0, ∞)) are searched as logarithms, p = a + e^u: a CPE magnitude of 1e−9 and a
 * resistance of 1e3 then take steps of the same relative size and the Jacobian's columns the same
 * order of magnitude (log-parameters). Parameters with two bounds (a CPE exponent in [0, 1]) stay
 * linear and are held inside their box by the minimiser's active set, so they can rest exactly on
 * a bound (an ideal capacitor has n = 1) without the flat spot a sine or logistic map has there.
 */

export interface Bounds {
  readonly lower: number;
  readonly upper: number;
}

const twoSided = (b: Bounds): boolean => Number.isFinite(b.lower) && Number.isFinite(b.upper);

export function toModelSpace(u: number, b: Bounds): number {
  if (twoSided(b)) return u;
  if (Number.isFinite(b.lower)) return b.lower + Math.exp(u);
  if (Number.isFinite(b.upper)) return b.upper - Math.exp(u);
  return u;
}

/** Inverse of toModelSpace; values on or past a one-sided bound are nudged just inside it, two-sided ones clipped into the box. */
export function toSearchSpace(p: number, b: Bounds): number {
  if (twoSided(b)) return Math.min(b.upper, Math.max(b.lower, p));
  const tiny = 1e-12 * Math.max(1, Math.abs(p));
  if (Number.isFinite(b.lower)) return Math.log(Math.max(p - b.lower, tiny));
  if (Number.isFinite(b.upper)) return Math.log(Math.max(b.upper - p, tiny));
  return p;
}

/** dp/du at u. */
export function modelSpaceSlope(u: number, b: Bounds): number {
  if (twoSided(b)) return 1;
  if (Number.isFinite(b.lower)) return Math.exp(u);
  if (Number.isFinite(b.upper)) return -Math.exp(u);
  return 1;
}

/** The box the minimiser keeps u in: the bounds themselves for two-sided parameters, no limit otherwise. */
export function searchBox(bounds: readonly Bounds[]): { lower: Float64Array; upper: Float64Array } {
  return {
    lower: Float64Array.from(bounds, (b) => (twoSided(b) ? b.lower : -Infinity)),
    upper: Float64Array.from(bounds, (b) => (twoSided(b) ? b.upper : Infinity)),
  };
}
