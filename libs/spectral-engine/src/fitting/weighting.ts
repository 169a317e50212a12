import type { Spectrum } from '../spectrum';

/**
 * How residuals are scaled before squaring:
 * - `modulus`: σ′ = σ″ = |Z| (each point weighs alike whatever its size; the usual choice),
 * - `proportional`: σ′ = |Z′|, σ″ = |Z″|,
 * - `unit`: σ = 1 ohm (large impedances dominate).
 */
export type Weighting = 'modulus' | 'proportional' | 'unit';

/**
 * 1/σ for the real rows then the imaginary rows (length 2N). Proportional weights on a part
 * that is exactly zero would be infinite: such a part falls back to modulus weighting.
 */
export function inverseSigmas(s: Spectrum, weighting: Weighting): Float64Array {
  const n = s.frequencyHz.length;
  const w = new Float64Array(2 * n);
  for (let i = 0; i < n; i++) {
    const modulus = Math.hypot(s.re[i], s.im[i]);
    if (weighting === 'unit') {
      w[i] = 1;
      w[n + i] = 1;
    } else if (weighting === 'modulus') {
      w[i] = 1 / modulus;
      w[n + i] = 1 / modulus;
    } else {
      w[i] = 1 / (Math.abs(s.re[i]) > 0 ? Math.abs(s.re[i]) : modulus);
      w[n + i] = 1 / (Math.abs(s.im[i]) > 0 ? Math.abs(s.im[i]) : modulus);
    }
  }
  return w;
}
