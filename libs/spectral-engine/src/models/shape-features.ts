import type { Spectrum } from '../spectrum';

/** Features of a spectrum's shape that the initial guesses read. Frequencies ascending. */
export interface ShapeFeatures {
  /** Real part at the highest frequency, Ω. */
  readonly reHigh: number;
  /** Real part at the lowest frequency, Ω. */
  readonly reLow: number;
  /** Largest −Z″ and the angular frequency where it occurs (rad/s). */
  readonly peakNegIm: number;
  readonly peakOmega: number;
  readonly peakIndex: number;
  readonly omega: Float64Array;
}

export function angularFrequencies(frequencyHz: Float64Array): Float64Array {
  const omega = new Float64Array(frequencyHz.length);
  for (let i = 0; i < omega.length; i++) omega[i] = 2 * Math.PI * frequencyHz[i];
  return omega;
}

export function shapeFeatures(s: Spectrum): ShapeFeatures {
  const n = s.frequencyHz.length;
  const omega = angularFrequencies(s.frequencyHz);
  let peakIndex = 0;
  for (let i = 1; i < n; i++) if (-s.im[i] > -s.im[peakIndex]) peakIndex = i;
  return {
    reHigh: s.re[n - 1],
    reLow: s.re[0],
    peakNegIm: -s.im[peakIndex],
    peakOmega: omega[peakIndex],
    peakIndex,
    omega,
  };
}

/** Least-squares slope of y against x. */
export function slope(x: ArrayLike<number>, y: ArrayLike<number>): number {
  const n = x.length;
  let mx = 0;
  let my = 0;
  for (let i = 0; i < n; i++) {
    mx += x[i];
    my += y[i];
  }
  mx /= n;
  my /= n;
  let sxy = 0;
  let sxx = 0;
  for (let i = 0; i < n; i++) {
    sxy += (x[i] - mx) * (y[i] - my);
    sxx += (x[i] - mx) ** 2;
  }
  return sxx > 0 ? sxy / sxx : 0;
}

export const clamp = (x: number, lo: number, hi: number): number => Math.min(hi, Math.max(lo, x));

/** Dispersion exponent of an arc from its height relative to its width: h = Δ/2·tan(απ/4). */
export function exponentFromArc(height: number, width: number): number {
  if (!(width > 0) || !(height > 0)) return 0.8;
  return clamp((4 / Math.PI) * Math.atan((2 * height) / width), 0.1, 1);
}
