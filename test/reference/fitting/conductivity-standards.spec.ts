import { cellConstantFromStandard, impedance, normaliseSpectrum, referConductivity } from '@ohmprint/spectral-engine';

describe('cell constant and temperature referral', () => {
  it('refers 1273 µS/cm at 20 °C to 25 °C with 2 %/°C as 1414.444 µS/cm', () => {
    // REFERENCES.md "Conductivity standards": κ25 = κT/(1 + α(T − 25)), α ≈ 2 %/°C (common practice).
    expect(referConductivity(1273, 20, 25, 0.02)).toBeCloseTo(1414.444, 3);
  });

  it('reads K = 1.0000 cm⁻¹ from 1413 µS/cm and a 707.714 Ω plateau', () => {
    // REFERENCES.md: 1413 µS/cm (0.01 mol/L KCl at 25 °C, common practice) and R = 707.714 Ω → K = 1.0000 cm⁻¹.
    const f = Float64Array.from({ length: 31 }, (_, i) => 10 ** (1 + (5 * i) / 30));
    // A cell: solution resistance in series with electrode polarisation, which makes the phase
    // leave 0° at low frequency; the plateau lies above it.
    const standard = impedance('r-cpe', { r: 707.714, q: 1e-3, n: 0.9 }, f);
    const k = cellConstantFromStandard(standard, { standardConductivityUSPerCm: 1413 });
    expect(k.cellConstantPerCm).toBeCloseTo(1.0, 3);
    expect(k.plateauFrequenciesHz[0]).toBeGreaterThan(10);
  });

  it('gives the CRC Handbook conductivity back from a cell calibrated with 0.01 mol/kg KCl at 25 °C', () => {
    // CRC Handbook, standard KCl solutions (after Wu, Koch & Pratt 1991), quoted in REFERENCES.md:
    // 0.01 mol/kg → 1408.23 µS/cm at 25 °C. A cell with K = 0.85 cm⁻¹ reads R = K/κ.
    const K = 0.85;
    const r = K / 1408.23e-6;
    const f = Float64Array.from({ length: 11 }, (_, i) => 10 ** (3 + (2 * i) / 10));
    const standard = { frequencyHz: f, re: new Float64Array(11).fill(r), im: new Float64Array(11) };
    expect(cellConstantFromStandard(standard, { standardConductivityUSPerCm: 1408.23 }).cellConstantPerCm).toBeCloseTo(K, 12);
    // Normalised at 25 °C, the specific impedance is the resistivity 1/κ = 710.11 Ω·cm.
    const specific = normaliseSpectrum(standard, { cellConstantPerCm: K, temperatureC: 25, referenceTemperatureC: 25, coefficientPerC: 0.02 });
    expect(specific.re[0]).toBeCloseTo(1e6 / 1408.23, 9);
  });

  it('makes a 20 °C reading of the 0.01 mol/kg standard agree with its 25 °C value within the linear model', () => {
    // CRC Handbook (REFERENCES.md): 1273.03 µS/cm at 20 °C and 1408.23 at 25 °C for 0.01 mol/kg KCl.
    // Their ratio implies α = (1 − 1273.03/1408.23)/5 = 1.92 %/°C; with that α the referral is exact.
    const alpha = (1 - 1273.03 / 1408.23) / 5;
    expect(referConductivity(1273.03, 20, 25, alpha)).toBeCloseTo(1408.23, 9);
    // With the generic 2 %/°C the referred value comes out 0.44 % high.
    expect(referConductivity(1273.03, 20, 25, 0.02) / 1408.23 - 1).toBeCloseTo(0.00444, 4);
  });
});
