/**
 * Mulberry32 (Tommy Ettinger's 32-bit generator, public domain): a tiny seeded pseudo-random
 * generator whose stream is the same on every platform, so a bootstrap interval computed today
 * can be computed again, to the last digit, from the seed stored with it. Not for anything secret.
 *
 * Returns a function giving uniform numbers in [0, 1), each a multiple of 2⁻³².
 */
export function seededRandom(seed: number): () => number {
  if (!Number.isInteger(seed) || seed < 0 || seed > 0xffffffff) throw new RangeError(`seededRandom: seed ${seed} must be a whole number from 0 to 4294967295`);
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}
