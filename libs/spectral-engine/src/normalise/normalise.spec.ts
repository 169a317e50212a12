import { averageReplicates } from './average-replicates';
import { cellConstantFromStandard, conductivityFromResistance } from './cell-constant';
import { normaliseSpectrum } from './normalise-spectrum';
import { referConductivity } from './temperature-referral';

const spectrum = (re: number[], im: number[], f = [1, 10, 100]) => ({ frequencyHz: Float64Array.from(f), re: Float64Array.from(re), im: Float64Array.from(im) });

describe('normalisation', () => {
  it('divides by the cell constant and refers impedance to the reference temperature', () => {
    // A sample 5 °C warmer than the reference conducts 10 % more at 2 %/°C, so its impedance is scaled up by 1.1.
    const s = normaliseSpectrum(spectrum([200, 100, 50], [-20, -10, -5]), { cellConstantPerCm: 2, temperatureC: 30, referenceTemperatureC: 25, coefficientPerC: 0.02 });
    expect(Array.from(s.re)).toEqual([110.00000000000001, 55.00000000000001, 27.500000000000004]);
    expect(s.im[0]).toBeCloseTo(-11, 12);
  });

  it('refuses settings that cannot be right', () => {
    const s = spectrum([1, 1, 1], [0, 0, 0]);
    expect(() => normaliseSpectrum(s, { cellConstantPerCm: 0, temperatureC: 25, referenceTemperatureC: 25, coefficientPerC: 0.02 })).toThrow('cellConstantPerCm must be a positive number, got 0');
    expect(() => referConductivity(1000, 25, 20, 2)).toThrow(/fraction per °C \(0.02 = 2 %\/°C\); 2 is outside/);
    expect(() => referConductivity(1000, -80, 25, 0.02)).toThrow(/too far from 25 °C/);
  });

  it('reads the cell constant from the resistive plateau and refuses a spectrum without one', () => {
    const k = cellConstantFromStandard(spectrum([1000, 710, 707], [-900, -5, -1]), { standardConductivityUSPerCm: 1413 });
    expect(Array.from(k.plateauFrequenciesHz)).toEqual([10, 100]);
    expect(k.plateauResistanceOhm).toBe(708.5);
    expect(conductivityFromResistance(708.5, k.cellConstantPerCm)).toBeCloseTo(1413, 9);
    expect(() => cellConstantFromStandard(spectrum([1, 1, 1], [-1, -1, -1]), { standardConductivityUSPerCm: 1413 })).toThrow(/no resistive plateau/);
  });

  it('averages replicates point by point and refuses mismatched grids', () => {
    const mean = averageReplicates([spectrum([1, 2, 3], [-1, -2, -3]), spectrum([3, 4, 5], [-3, -4, -5])]);
    expect(Array.from(mean.re)).toEqual([2, 3, 4]);
    expect(Array.from(mean.im)).toEqual([-2, -3, -4]);
    expect(() => averageReplicates([])).toThrow('no replicates to average');
    expect(() => averageReplicates([spectrum([1, 2, 3], [0, 0, 0]), spectrum([1, 2, 3], [0, 0, 0], [1, 10, 200])])).toThrow(/replicate 2 differs from replicate 1 at point 3/);
  });
});
