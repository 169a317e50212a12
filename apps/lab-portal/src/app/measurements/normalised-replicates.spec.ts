import { normalisedReplicates } from './normalised-replicates';

describe('normalisedReplicates', () => {
  it('refers a replicate to the version temperature and divides by its cell constant', () => {
    // Handbook linear compensation (common practice, α = 2 %/°C): 1273 µS/cm at 20 °C is 1414.444 µS/cm at 25 °C.
    // With a 1 cm⁻¹ cell the plateau resistance is 1/κ, so Z′ goes from 1e6/1273 Ω to 1e6/1414.444 Ω·cm.
    const [one] = normalisedReplicates(
      [{ label: 'Replicate 1', frequencyHz: [1000], re: [1e6 / 1273], im: [0], cellConstantPerCm: 1, temperatureC: 20 }],
      { referenceTemperatureC: 25, temperatureCoefficientPerC: 0.02 },
    );
    expect(one.re[0]).toBeCloseTo(1e6 / 1414.444, 3);

    // A 0.5 cm⁻¹ cell doubles the specific impedance of the same resistance (Z/K).
    const [half] = normalisedReplicates(
      [{ label: 'Replicate 2', frequencyHz: [10, 1000], re: [200, 100], im: [-40, -5], cellConstantPerCm: 0.5, temperatureC: 25, muted: true }],
      { referenceTemperatureC: 25, temperatureCoefficientPerC: 0.02 },
    );
    expect(Array.from(half.re)).toEqual([400, 200]);
    expect(Array.from(half.im)).toEqual([-80, -10]);
    expect(half.muted).toBe(true);
  });
});
