import type { Spectrum } from '../spectrum';
import { assertFiniteValues } from '../statistics/finite-values';
import { formatFrequency } from './format-frequency';

/** A part of the method's band that a spectrum does not reach. */
export interface MissingBand {
  readonly fromHz: number;
  readonly toHz: number;
}

/** Raised when a spectrum does not cover the grid's band; resampling never extrapolates. */
export class GridCoverageError extends RangeError {
  constructor(
    readonly measuredFromHz: number,
    readonly measuredToHz: number,
    readonly missing: readonly MissingBand[],
  ) {
    super(
      `the spectrum covers ${formatFrequency(measuredFromHz)} to ${formatFrequency(measuredToHz)} but the grid needs ` +
        missing.map((b) => `${formatFrequency(b.fromHz)} to ${formatFrequency(b.toHz)}`).join(' and ') +
        ' as well; measure the missing band or choose a method whose band the spectrum covers',
    );
    this.name = 'GridCoverageError';
  }
}

/** Grid ends that miss the measured band by less than this (relative) are rounding, not a gap. */
const EDGE_TOLERANCE = 1e-9;

function assertAscending(f: ArrayLike<number>, name: string): void {
  for (let i = 0; i < f.length; i++) {
    if (!(Number.isFinite(f[i]) && f[i] > 0)) throw new RangeError(`${name}: frequency ${i + 1} is ${f[i]} Hz; frequencies must be positive numbers`);
    if (i > 0 && !(f[i] > f[i - 1])) {
      throw new RangeError(`${name}: frequency ${i + 1} (${f[i]} Hz) does not rise above frequency ${i} (${f[i - 1]} Hz); frequencies must be strictly ascending`);
    }
  }
}

/**
 * Resamples a spectrum (Hz, Ω) onto `grid` (Hz, strictly ascending) by linear interpolation of
 * the real and imaginary parts in log10-frequency (numpy `interp` on log10 f). A spectrum that
 * does not cover the whole grid raises `GridCoverageError` naming the missing band.
 */
export function resample(s: Spectrum, grid: Float64Array): Spectrum {
  const f = s.frequencyHz;
  if (f.length < 2) throw new RangeError(`resample: the spectrum has ${f.length} frequencies; at least two are needed`);
  if (s.re.length !== f.length || s.im.length !== f.length) {
    throw new RangeError(`resample: the spectrum has ${f.length} frequencies but ${s.re.length} real and ${s.im.length} imaginary values`);
  }
  if (grid.length === 0) throw new RangeError('resample: the grid has no frequencies');
  assertAscending(f, 'resample: spectrum');
  assertAscending(grid, 'resample: grid');
  assertFiniteValues(s.re, 're', 'resample: spectrum');
  assertFiniteValues(s.im, 'im', 'resample: spectrum');
  const fLo = f[0];
  const fHi = f[f.length - 1];
  const missing: MissingBand[] = [];
  if (grid[0] < fLo * (1 - EDGE_TOLERANCE)) missing.push({ fromHz: grid[0], toHz: fLo });
  if (grid[grid.length - 1] > fHi * (1 + EDGE_TOLERANCE)) missing.push({ fromHz: fHi, toHz: grid[grid.length - 1] });
  if (missing.length > 0) throw new GridCoverageError(fLo, fHi, missing);

  const logF = Float64Array.from(f, Math.log10);
  const re = new Float64Array(grid.length);
  const im = new Float64Array(grid.length);
  let k = 0;
  for (let i = 0; i < grid.length; i++) {
    const x = Math.min(Math.max(Math.log10(grid[i]), logF[0]), logF[logF.length - 1]);
    while (k < logF.length - 2 && logF[k + 1] < x) k++;
    const t = (x - logF[k]) / (logF[k + 1] - logF[k]);
    re[i] = s.re[k] + (s.re[k + 1] - s.re[k]) * t;
    im[i] = s.im[k] + (s.im[k + 1] - s.im[k]) * t;
  }
  return { frequencyHz: Float64Array.from(grid), re, im };
}
