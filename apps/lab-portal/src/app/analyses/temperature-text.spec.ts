import type { Analysis } from '@ohmprint/contracts';
import { temperatureText } from './temperature-text';

const method = { referenceTemperatureC: 20, temperatureCoefficientPerC: 0.02 } as Analysis['method'];

describe('temperatureText', () => {
  it('states one shared temperature once, with its source and the referral', () => {
    const temps = [1, 2].map((n) => ({ replicateNumber: n, fileName: `r${n}.csv`, temperatureC: 18, source: 'file' as const }));
    expect(temperatureText({ method, measurementTemperatures: temps })).toBe(
      'Measured at 18 °C (stated in the file) for all 2 replicates; spectra referred to 20 °C with a linear coefficient of 2 %/°C.',
    );
  });

  it('lists each replicate when they differ', () => {
    const temps = [
      { replicateNumber: 1, fileName: 'a', temperatureC: 18, source: 'file' as const },
      { replicateNumber: 2, fileName: 'b', temperatureC: 20.25, source: 'entered' as const },
    ];
    expect(temperatureText({ method, measurementTemperatures: temps })).toMatch(/^Measured at replicate 1 18 °C \(stated in the file\), replicate 2 20\.25 °C \(entered; the file states none\);/);
  });

  it('says so when an older analysis did not record them', () => {
    expect(temperatureText({ method })).toMatch(/^Measurement temperature not recorded/);
  });
});
