// Invented demo spectra for the engine benchmarks: Rs + (R ∥ CPE) families with lot-to-lot spread and noise.
import type { Spectrum } from '../../../libs/spectral-engine/src/index';

/** Small seeded generator (mulberry32) so every run builds the same library. */
export function seeded(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** `count` spectra on `frequencyHz`, drawn from `families` invented products. */
export function syntheticLibrary(count: number, frequencyHz: Float64Array, families: number, seed: number): Spectrum[] {
  const random = seeded(seed);
  const products = Array.from({ length: families }, () => ({
    rs: 10 + 90 * random(),
    r: 200 + 4000 * random(),
    q: 10 ** (-7 + 2 * random()),
    n: 0.6 + 0.35 * random(),
  }));
  return Array.from({ length: count }, () => {
    const p = products[Math.floor(random() * families)];
    const lot = (x: number, spread: number) => x * (1 + spread * (random() - 0.5));
    const rs = lot(p.rs, 0.04);
    const r = lot(p.r, 0.04);
    const q = lot(p.q, 0.04);
    const n = lot(p.n, 0.01);
    const re = new Float64Array(frequencyHz.length);
    const im = new Float64Array(frequencyHz.length);
    frequencyHz.forEach((f, i) => {
      const w = 2 * Math.PI * f;
      // R / (1 + R·Q·(jω)^n)
      const a = r * q * w ** n;
      const c = 1 + a * Math.cos((n * Math.PI) / 2);
      const d = a * Math.sin((n * Math.PI) / 2);
      const den = c * c + d * d;
      re[i] = (rs + (r * c) / den) * (1 + 0.002 * (random() - 0.5));
      im[i] = ((-r * d) / den) * (1 + 0.002 * (random() - 0.5));
    });
    return { frequencyHz, re, im };
  });
}

export const median = (xs: number[]): number => {
  const s = [...xs].sort((a, b) => a - b);
  return s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
};

/** R / (1 + R·Q·(jω)^n) + Rs at one frequency, with a relative ripple of `noise` on each part. */
function zarcPoint(rs: number, r: number, q: number, n: number, w: number, noise: () => number): [number, number] {
  const a = r * q * w ** n;
  const c = 1 + a * Math.cos((n * Math.PI) / 2);
  const d = a * Math.sin((n * Math.PI) / 2);
  const den = c * c + d * d;
  return [(rs + (r * c) / den) * (1 + noise()), ((-r * d) / den) * (1 + noise())];
}

/**
 * A broad library: `count` spectra each with its own Rs + (R ∥ CPE) drawn over decades (no
 * product families), so spectra lie far apart; and a query that is one of them re-measured
 * (0.2 % noise), so exactly one reference is near it.
 */
export function broadLibrary(count: number, frequencyHz: Float64Array, seed: number): { library: Spectrum[]; query: Spectrum; near: number } {
  const random = seeded(seed);
  const logUniform = (lo: number, hi: number) => Math.exp(Math.log(lo) + random() * Math.log(hi / lo));
  const params = Array.from({ length: count }, () => ({ rs: logUniform(1, 1000), r: logUniform(10, 1e5), q: logUniform(1e-9, 1e-4), n: 0.5 + 0.5 * random() }));
  const draw = (p: (typeof params)[number], noise: () => number): Spectrum => {
    const re = new Float64Array(frequencyHz.length);
    const im = new Float64Array(frequencyHz.length);
    frequencyHz.forEach((f, i) => {
      [re[i], im[i]] = zarcPoint(p.rs, p.r, p.q, p.n, 2 * Math.PI * f, noise);
    });
    return { frequencyHz, re, im };
  };
  const library = params.map((p) => draw(p, () => 0.002 * (random() - 0.5)));
  const near = Math.floor(random() * count);
  return { library, query: draw(params[near], () => 0.002 * (random() - 0.5)), near };
}
