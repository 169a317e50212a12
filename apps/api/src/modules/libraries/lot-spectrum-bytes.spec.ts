import { decodeLotSpectrum, encodeLotSpectrum } from './lot-spectrum-bytes';

describe('stored lot spectra', () => {
  it('come back bit for bit, so a reproduced analysis sees the same numbers', () => {
    const grid = Float64Array.of(100, 1000, 10000);
    const s = { re: Float64Array.of(512.25, 0.1 + 0.2, 1e-300), im: Float64Array.of(-3.5, -Number.MIN_VALUE, 0) };
    const back = decodeLotSpectrum(encodeLotSpectrum(s), grid);
    expect(Array.from(back.re)).toEqual(Array.from(s.re));
    expect(Array.from(back.im)).toEqual(Array.from(s.im));
  });

  it('refuses bytes written for another grid length', () => {
    expect(() => decodeLotSpectrum(Buffer.alloc(16 * 4), Float64Array.of(1, 2, 3))).toThrow(/3-point grid/);
  });
});
