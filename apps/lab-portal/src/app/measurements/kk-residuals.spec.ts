import { kkResiduals } from './kk-residuals';

/** Rs = 20 Ω + ZARC(R = 100 Ω, Q = 1e−4, n = 0.8) over 61 points 100 kHz → 0.1 Hz (REFERENCES.md). */
function rsZarc() {
  const frequencyHz: number[] = [];
  const re: number[] = [];
  const im: number[] = [];
  for (let i = 0; i <= 60; i++) {
    const f = 10 ** (-1 + i / 10);
    const w = 2 * Math.PI * f;
    // (jω)^n = ωⁿ·(cos nπ/2 + j sin nπ/2)
    const a = 100 * 1e-4 * w ** 0.8;
    const dr = 1 + a * Math.cos(0.4 * Math.PI);
    const di = a * Math.sin(0.4 * Math.PI);
    const d2 = dr * dr + di * di;
    frequencyHz.push(f);
    re.push(20 + (100 * dr) / d2);
    im.push((-100 * di) / d2);
  }
  return { frequencyHz, re, im };
}

describe('kkResiduals', () => {
  it('gives residuals near zero for a causal, stable spectrum at M = 20', () => {
    // REFERENCES.md [computed: numpy]: Rs + ZARC at M = 20 → max |residual| 0.011 %
    const r = kkResiduals(rsZarc(), { passed: true, maxResidualPercent: 0.011, elements: 20, mu: 0.8, limitPercent: 1 });
    const worst = Math.max(...Array.from(r.rePercent, Math.abs), ...Array.from(r.imPercent, Math.abs));
    expect(worst).toBeLessThan(0.05);
    expect(r.frequencyHz).toHaveLength(61);
    expect(r.limitPercent).toBe(1);
  });
});
