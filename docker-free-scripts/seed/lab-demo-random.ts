/**
 * Deterministic pseudo-random numbers for the demo data, so every seed run and every committed
 * demo file come out the same. Mulberry32 (a small, well-known 32-bit generator) with Box–Muller
 * normals; quality is ample for invented lot-to-lot variation, and it is never used for secrets.
 */
export interface DemoRandom {
  /** Uniform on [0, 1). */
  uniform(): number;
  /** Normal with the given mean and standard deviation. */
  normal(mean?: number, sd?: number): number;
}

export function demoRandom(seed: number): DemoRandom {
  let state = seed >>> 0;
  const uniform = (): number => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  let spare: number | null = null;
  const normal = (mean = 0, sd = 1): number => {
    if (spare !== null) {
      const z = spare;
      spare = null;
      return mean + sd * z;
    }
    let u = 0;
    while (u === 0) u = uniform();
    const v = uniform();
    const r = Math.sqrt(-2 * Math.log(u));
    spare = r * Math.sin(2 * Math.PI * v);
    return mean + sd * r * Math.cos(2 * Math.PI * v);
  };
  return { uniform, normal };
}

/** A stable 32-bit seed from a label, so each product and sample gets its own stream. */
export function seedFrom(label: string): number {
  let h = 2166136261;
  for (let i = 0; i < label.length; i++) h = Math.imul(h ^ label.charCodeAt(i), 16777619);
  return h >>> 0;
}
