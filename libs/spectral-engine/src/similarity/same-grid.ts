import type { Spectrum } from '../spectrum';

/** Frequencies closer than this (relative) are the same grid point: files round frequencies differently. */
const RELATIVE_TOLERANCE = 1e-9;

/**
 * Throws unless both spectra sit on the same frequency grid and each is internally consistent,
 * naming the first point that differs so the cause is easy to find.
 */
export function assertSameGrid(a: Spectrum, b: Spectrum, aName = 'the first spectrum', bName = 'the second spectrum'): void {
  assertWellFormed(a, aName);
  assertWellFormed(b, bName);
  assertSameFrequencies(a.frequencyHz, b.frequencyHz, aName, bName);
}

/** Throws unless two frequency arrays (Hz) are the same grid, naming the first point that differs. */
export function assertSameFrequencies(fa: Float64Array, fb: Float64Array, aName: string, bName: string): void {
  if (fa.length !== fb.length) {
    throw new RangeError(`spectra are on different grids: ${aName} has ${fa.length} frequencies and ${bName} has ${fb.length}; resample both onto the method's grid first`);
  }
  for (let i = 0; i < fa.length; i++) {
    if (Math.abs(fa[i] - fb[i]) > RELATIVE_TOLERANCE * Math.max(Math.abs(fa[i]), Math.abs(fb[i]))) {
      throw new RangeError(`spectra are on different grids: point ${i + 1} is ${fa[i]} Hz in ${aName} and ${fb[i]} Hz in ${bName}; resample both onto the method's grid first`);
    }
  }
}

/** Throws unless frequency, real and imaginary arrays have one length and at least one point. */
export function assertWellFormed(s: Spectrum, name: string): void {
  const n = s.frequencyHz.length;
  if (n === 0) throw new RangeError(`${name} has no frequencies`);
  if (s.re.length !== n || s.im.length !== n) {
    throw new RangeError(`${name} has ${n} frequencies but ${s.re.length} real and ${s.im.length} imaginary values`);
  }
}
