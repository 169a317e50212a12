import type { Spectrum } from '@ohmprint/spectral-engine';

/**
 * A lot's spectrum on its version's grid as bytes: little-endian float64, the N real parts then
 * the N imaginary parts. Compact and quick to load for libraries of thousands of lots; the grid
 * itself is stored once, on the version.
 */
export function encodeLotSpectrum(s: Pick<Spectrum, 're' | 'im'>): Buffer {
  const n = s.re.length;
  const buf = Buffer.alloc(16 * n);
  for (let i = 0; i < n; i++) {
    buf.writeDoubleLE(s.re[i], 8 * i);
    buf.writeDoubleLE(s.im[i], 8 * (n + i));
  }
  return buf;
}

export function decodeLotSpectrum(bytes: Buffer, grid: Float64Array): Spectrum {
  const n = grid.length;
  if (bytes.length !== 16 * n) throw new RangeError(`a lot spectrum for a ${n}-point grid has ${16 * n} bytes, not ${bytes.length}`);
  const re = new Float64Array(n);
  const im = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    re[i] = bytes.readDoubleLE(8 * i);
    im[i] = bytes.readDoubleLE(8 * (n + i));
  }
  return { frequencyHz: grid, re, im };
}
