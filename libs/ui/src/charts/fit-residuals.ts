import type { KkResiduals } from './kk-residual-layout';

/** A fitted model's curve at the measured frequencies. */
export interface FittedCurve {
  readonly re: ArrayLike<number>;
  readonly im: ArrayLike<number>;
}

/**
 * Relative residuals of a fit, as the engine reports them: (Z′ − Ẑ′)/|Z| and (Z″ − Ẑ″)/|Z| in %,
 * |Z| the measured modulus at each frequency. Null when the curve does not match the data point
 * for point (an older analysis, or a curve for another grid).
 */
export function fitResiduals(data: { readonly frequencyHz: ArrayLike<number>; readonly re: ArrayLike<number>; readonly im: ArrayLike<number> }, curve: FittedCurve): Omit<KkResiduals, 'limitPercent'> | null {
  const n = data.frequencyHz.length;
  if (curve.re.length !== n || curve.im.length !== n || n === 0) return null;
  const rePercent = new Float64Array(n);
  const imPercent = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const modulus = Math.hypot(data.re[i], data.im[i]);
    rePercent[i] = (100 * (data.re[i] - curve.re[i])) / modulus;
    imPercent[i] = (100 * (data.im[i] - curve.im[i])) / modulus;
  }
  return { frequencyHz: data.frequencyHz, rePercent, imPercent };
}
