import { assertFiniteValues } from './finite-values';

/** Arithmetic mean of finite values (same unit as the values). Throws on an empty input. */
export function mean(values: ArrayLike<number>): number {
  assertFiniteValues(values, 'values', 'mean');
  if (values.length === 0) throw new RangeError('mean: needs at least one value');
  let sum = 0;
  for (let i = 0; i < values.length; i++) sum += values[i];
  const first = sum / values.length;
  // A second pass over the residuals removes most of the first sum's rounding error (R's mean does the same).
  let correction = 0;
  for (let i = 0; i < values.length; i++) correction += values[i] - first;
  return first + correction / values.length;
}

/**
 * Sample variance with n − 1 in the denominator (numpy `var(ddof=1)`, R `var`); unit squared.
 * Needs at least two values.
 */
export function variance(values: ArrayLike<number>): number {
  if (values.length < 2) throw new RangeError(`variance: needs at least two values, got ${values.length}`);
  const m = mean(values);
  let sum = 0;
  for (let i = 0; i < values.length; i++) sum += (values[i] - m) ** 2;
  return sum / (values.length - 1);
}

/** Sample standard deviation with n − 1 (numpy `std(ddof=1)`, R `sd`); same unit as the values. */
export function standardDeviation(values: ArrayLike<number>): number {
  return Math.sqrt(variance(values));
}

/** Smallest, largest, mean, sample standard deviation and count, for report tables. */
export interface Summary {
  readonly count: number;
  readonly min: number;
  readonly max: number;
  readonly mean: number;
  /** Sample standard deviation (n − 1); null for a single value. */
  readonly sd: number | null;
}

/** Summary statistics of finite values (same unit as the values). */
export function summarise(values: ArrayLike<number>): Summary {
  const m = mean(values);
  let min = Infinity;
  let max = -Infinity;
  for (let i = 0; i < values.length; i++) {
    if (values[i] < min) min = values[i];
    if (values[i] > max) max = values[i];
  }
  return { count: values.length, min, max, mean: m, sd: values.length > 1 ? standardDeviation(values) : null };
}
