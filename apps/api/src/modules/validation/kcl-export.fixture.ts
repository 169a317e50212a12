import { impedance } from '@ohmprint/spectral-engine';

/** For the validation tests: a KCl standard's sweep through a cell, R + CPE, as an instrument export (Hz, Ω, −Z″). */
export function kclExport(resistanceOhm: number, fromHz = 1e3, toHz = 1e6): string {
  const n = 31;
  const f = Float64Array.from({ length: n }, (_, i) => fromHz * (toHz / fromHz) ** (i / (n - 1)));
  const z = impedance('r-cpe', { r: resistanceOhm, q: 2e-5, n: 0.88 }, f);
  const lines = Array.from(f, (v, i) => `${v};${z.re[i]};${-z.im[i]}`);
  return ['Freq / Hz;Zre / Ohm;-Zim / Ohm', ...lines].join('\n');
}
