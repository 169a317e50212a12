/**
 * Quantile of sorted values by linear interpolation between order statistics: the default of
 * numpy.percentile ("linear") and R's quantile type 7, so figures match what an analyst gets
 * from either tool.
 *
 * @param sorted values in ascending order (not checked, for speed in per-frequency loops)
 * @param p probability in [0, 1]
 */
export function quantileSorted(sorted: ArrayLike<number>, p: number): number {
  const n = sorted.length;
  if (n === 0) throw new RangeError('quantile of an empty set');
  if (!(p >= 0 && p <= 1)) throw new RangeError(`quantile probability ${p} is outside [0, 1]`);
  const h = (n - 1) * p;
  const lo = Math.floor(h);
  const hi = Math.min(lo + 1, n - 1);
  return sorted[lo] + (h - lo) * (sorted[hi] - sorted[lo]);
}
