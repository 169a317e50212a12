import { assertFiniteValues } from './finite-values';

/**
 * The continuous sample-quantile definitions of Hyndman & Fan (1996), by their type number.
 * `type7` is R's default and numpy's default (`method='linear'`).
 */
export type QuantileDefinition = 'type4' | 'type5' | 'type6' | 'type7' | 'type8' | 'type9';

/** Plotting-position constants (α, β) of each definition, as numpy lists them for `np.quantile`. */
const PLOTTING_POSITIONS: Record<QuantileDefinition, readonly [number, number]> = {
  type4: [0, 1],
  type5: [0.5, 0.5],
  type6: [0, 0],
  type7: [1, 1],
  type8: [1 / 3, 1 / 3],
  type9: [3 / 8, 3 / 8],
};

/** Plain-words name of a quantile definition, for reports and decision-rule sentences. */
export const QUANTILE_DEFINITION_NAMES: Record<QuantileDefinition, string> = {
  type4: 'Hyndman–Fan type 4 (interpolated inverted CDF)',
  type5: 'Hyndman–Fan type 5 (Hazen)',
  type6: 'Hyndman–Fan type 6 (Weibull)',
  type7: 'Hyndman–Fan type 7 (linear interpolation; R and numpy default)',
  type8: 'Hyndman–Fan type 8 (median-unbiased)',
  type9: 'Hyndman–Fan type 9 (normal-unbiased)',
};

/**
 * Sample quantile at probability `p` (0 ≤ p ≤ 1) of finite values, in the values' unit, by the
 * named definition (default type 7). Sorts a copy; the input is left as it is.
 */
export function quantile(values: ArrayLike<number>, p: number, definition: QuantileDefinition = 'type7'): number {
  assertFiniteValues(values, 'values', 'quantile');
  if (values.length === 0) throw new RangeError('quantile: needs at least one value');
  if (!(p >= 0 && p <= 1)) throw new RangeError(`quantile: probability ${p} must lie in [0, 1]`);
  const positions = PLOTTING_POSITIONS[definition];
  if (!positions) throw new RangeError(`quantile: unknown definition "${definition}"`);
  const sorted = Float64Array.from(values).sort();
  const n = sorted.length;
  const [alpha, beta] = positions;
  // Zero-based virtual index, as numpy computes it, clipped to the sample.
  const h = Math.min(Math.max(n * p + alpha + p * (1 - alpha - beta) - 1, 0), n - 1);
  const lower = Math.floor(h);
  const upper = Math.min(lower + 1, n - 1);
  const t = h - lower;
  const a = sorted[lower];
  const b = sorted[upper];
  // numpy's interpolation form: the two halves keep the endpoints exact.
  return t >= 0.5 ? b - (b - a) * (1 - t) : a + (b - a) * t;
}
