import { binomialTestGreater, cellConstantFromStandard, controlChart, conductivityAt, kclConductivity, referConductivity } from '@ohmprint/spectral-engine';
import fixture from '../fixtures/validation/validation.json';

describe('KCl standard conductivity', () => {
  it('gives the tabulated 25 °C values', () => {
    // CRC Handbook, standard KCl solutions after Wu, Koch & Pratt (1991), molal basis.
    expect(kclConductivity(0.01, 'molal', 25).conductivityUsPerCm).toBeCloseTo(1408.23, 6);
    expect(kclConductivity(0.1, 'molal', 25).conductivityUsPerCm).toBeCloseTo(12824.6, 6);
    expect(kclConductivity(1, 'molal', 25).conductivityUsPerCm).toBeCloseTo(108620, 6);
    // Molar values printed on commercial standards (common practice).
    expect(kclConductivity(0.01, 'molar', 25).conductivityUsPerCm).toBe(1413);
  });

  it('refers to 20 °C by linear compensation within 0.5 % of the handbook’s 20 °C value', () => {
    // Linear compensation κ_T = κ25·(1 + 0.02·(T − 25)), α = 2 %/°C (common practice);
    // CRC Handbook (Wu, Koch & Pratt 1991): 0.01 mol/kg → 1273.03 µS/cm, 0.1 mol/kg → 11 615.9 at 20 °C.
    const k20 = kclConductivity(0.01, 'molal', 20).conductivityUsPerCm;
    expect(k20).toBeCloseTo(1408.23 * 0.9, 6);
    expect(Math.abs(k20 - 1273.03) / 1273.03).toBeLessThan(0.005);
    expect(Math.abs(kclConductivity(0.1, 'molal', 20).conductivityUsPerCm - 11615.9) / 11615.9).toBeLessThan(0.008);
    // The same formula the other way: 1273 µS/cm at 20 °C → 1414.444 at 25 °C (reference notes).
    expect(referConductivity(1273, 20, 25, 0.02)).toBeCloseTo(1414.444, 3);
    expect(conductivityAt(1414.444, 20).conductivityUsPerCm).toBeCloseTo(1273, 2);
  });

  it('refuses a concentration with no tabulated value', () => {
    expect(() => kclConductivity(0.05, 'molal', 25)).toThrow(/certificate/);
  });

  it('reads the cell constant from a spectrum’s plateau', () => {
    // Reference notes: 1413 µS/cm and R = 707.714 Ω → K = 1.0000 cm⁻¹ (K = κ·R).
    const f = Float64Array.from([1e3, 1e4, 1e5, 1e6]);
    const s = { frequencyHz: f, re: Float64Array.from([900, 707.714, 707.714, 707.714]), im: Float64Array.from([-400, -2, -1, -3]) };
    expect(cellConstantFromStandard(s, { standardConductivityUSPerCm: 1413 }).cellConstantPerCm).toBeCloseTo(1.0, 4);
  });
});

describe('Ohmprint’s control chart rules (common SPC practice)', () => {
  const steady = [1.0, 1.002, 0.998, 1.001, 0.999, 1.0, 1.002, 0.998, 1.001, 0.999];

  it('sets centre and limits from the baseline (mean; σ = mean moving range ÷ 1.128)', () => {
    const c = controlChart(steady);
    expect(c.centre).toBeCloseTo(1.0, 12);
    // moving ranges of the baseline by hand: .002 .004 .003 .002 .001 .002 .004 .003 .002 → mean .002556
    expect(c.sigma).toBeCloseTo(0.023 / 9 / 1.128, 12);
    expect(c.inControl).toBe(true);
  });

  it('flags one point beyond 3σ, and a later good run releases', () => {
    const out = controlChart([...steady, 1.05]);
    expect(out.inControl).toBe(false);
    expect(out.points[10].signals.map((s) => s.rule)).toEqual(['beyond-3-sigma']);
    expect(controlChart([...steady, 1.05, 1.0]).inControl).toBe(true);
  });

  it('flags eight in a row on one side and six rising in a row', () => {
    const side = controlChart([...steady, 1.001, 1.002, 1.001, 1.003, 1.002, 1.001, 1.002, 1.001]);
    expect(side.points.at(-1)?.signals.map((s) => s.rule)).toContain('run-one-side');
    const trend = controlChart([...steady, 0.996, 0.997, 0.998, 0.999, 1.0, 1.001]);
    expect(trend.points.at(-1)?.signals.map((s) => s.rule)).toContain('trend');
    expect(trend.inControl).toBe(false);
  });

  it('applies no rule before five baseline runs', () => {
    expect(controlChart([1, 2, 3]).centre).toBeNull();
    expect(controlChart([1, 2, 3]).inControl).toBe(true);
  });
});

describe('one-sided binomial test against scipy.stats.binomtest', () => {
  it.each(fixture.binomtest.map((c) => [`k=${c.k} n=${c.n} p=${c.p}`, c] as const))('%s', (_n, c) => {
    // fixtures/validation/generate.py: scipy.stats.binomtest(k, n, p, alternative='greater').pvalue
    expect(Math.abs(binomialTestGreater(c.k, c.n, c.p) - c.pvalue)).toBeLessThanOrEqual(Math.max(1e-11 * c.pvalue, 1e-14)); // relative, with an absolute floor for tiny p
  });
});
