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
