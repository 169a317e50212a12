import { impedance } from '@ohmprint/spectral-engine';
import fixture from '../fixtures/fitting/models.json';

interface NumpyCase {
  readonly model: string;
  readonly parameters: Record<string, number>;
  readonly frequencyHz: number[];
  readonly re: number[];
  readonly im: number[];
}
// JSON imports type every optional key as possibly undefined; the generator writes each case whole.
const cases = fixture.cases as unknown as NumpyCase[];

const at = (omega: number) => Float64Array.of(omega / (2 * Math.PI));

function z(model: string, p: Record<string, number>, omega: number): [number, number] {
  const s = impedance(model, p, at(omega));
  return [s.re[0], s.im[0]];
}

function expectComplex(actual: [number, number], re: number, im: number, relative = 1e-10): void {
  const scale = Math.hypot(re, im);
  expect(Math.abs(actual[0] - re)).toBeLessThanOrEqual(relative * scale);
  expect(Math.abs(actual[1] - im)).toBeLessThanOrEqual(relative * scale);
}

describe('model closed forms against numpy', () => {
  // Values listed in REFERENCES.md, "Fractional-order elements" [computed: numpy], printed to 12 digits.
  it('matches the listed CPE, ZARC, Cole–Cole and Havriliak–Negami values', () => {
    expectComplex(z('cpe', { q: 1e-5, n: 0.8 }, 1000), 123.021881284, -378.622418739); // numpy, REFERENCES.md
    expectComplex(z('r-zarc', { rs: 0, r: 1000, q: 1e-5, n: 0.8 }, 1000), 200.430452066, -269.571734295); // numpy, REFERENCES.md
    expectComplex(z('cole-cole', { rInf: 100, r0: 1000, tau: 1e-3, alpha: 0.7 }, 1000), 550, -275.760354663); // numpy, REFERENCES.md
    const hn = { rInf: 100, r0: 1000, tau: 1e-3, alpha: 0.8, beta: 0.6 };
    expectComplex(z('havriliak-negami', hn, 1000), 726.943615285, -248.224537228); // numpy, REFERENCES.md
    expectComplex(z('havriliak-negami', hn, 100), 966.016526557, -74.3393663494); // numpy, REFERENCES.md
  });

  it('matches the listed Warburg and Randles values', () => {
    expectComplex(z('warburg', { sigma: 50 }, 1000), 1.58113883008, -1.58113883008); // numpy, REFERENCES.md
    expectComplex(z('warburg-finite-length', { z0: 100, tau: 0.1 }, 1), 99.8668850029, -3.32794535664); // numpy, REFERENCES.md
    expectComplex(z('warburg-finite-space', { z0: 100, tau: 0.1 }, 1), 33.331217145, -1000.22220106); // numpy, REFERENCES.md
    // Randles Rs=20, Rct=100, Cdl=25 µF (a CPE with n = 1), σ=300 at f = 1 Hz.
    const randles = impedance('randles-cpe', { rs: 20, rct: 100, q: 25e-6, n: 1, sigma: 300 }, Float64Array.of(1));
    expectComplex([randles.re[0], randles.im[0]], 231.407429305, -124.634765352); // numpy, REFERENCES.md
  });

  it('meets the Cole–Cole identity at ωτ = 1: Re = (R0+R∞)/2, Im = −(R0−R∞)/2·tan(απ/4)', () => {
    // Closed form quoted in REFERENCES.md, "Fractional-order elements".
    expectComplex(z('cole-cole', { rInf: 40, r0: 640, tau: 2e-4, alpha: 0.6 }, 5000), 340, -300 * Math.tan((0.6 * Math.PI) / 4), 1e-12);
  });

  // Every built-in model at 17 frequencies from 0.01 Hz to 1 MHz: fixtures/fitting/models.json,
  // written by fixtures/fitting/generate.py with numpy's complex arithmetic.
  it.each(cases.map((c, i) => [`${c.model} #${i + 1}`, c] as const))('matches numpy for %s', (_label, c) => {
    const s = impedance(c.model, c.parameters, Float64Array.from(c.frequencyHz));
    c.re.forEach((re, i) => expectComplex([s.re[i], s.im[i]], re, c.im[i], 1e-9)); // numpy, models.json
  });
});
