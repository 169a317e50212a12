import { calibrate, judge, type Spectrum } from '@ohmprint/spectral-engine';
import fixture from '../fixtures/similarity/canberra.json';

const f = Float64Array.from(fixture.spectra.frequencyHz);
const asSpectrum = (s: { re: number[]; im: number[] }): Spectrum => ({ frequencyHz: f, re: Float64Array.from(s.re), im: Float64Array.from(s.im) });

describe('calibration and verdict against SciPy cdist and numpy quantiles', () => {
  const library = fixture.spectra.items.map(asSpectrum);
  const calibration = calibrate(library);
  const expected = fixture.calibration;

  it('finds each lot’s leave-one-out nearest lot and distance', () => {
    expect(calibration.nearestLots).toEqual(expected.nearestLots); // generate.py: argmin of scipy cdist rows without the diagonal
    calibration.nearestDistances.forEach((d, i) => expect(d).toBeCloseTo(expected.nearestDistances[i], 13)); // scipy cdist canberra / 2N
  });

  it('sets T95 and T99 at numpy’s default quantiles', () => {
    expect(calibration.lowerThreshold).toBeCloseTo(expected.t95, 13); // numpy.quantile(nearest, 0.95), method='linear'
    expect(calibration.upperThreshold).toBeCloseTo(expected.t99, 13); // numpy.quantile(nearest, 0.99), method='linear'
  });

  it.each(expected.samples.map((s) => [s.verdict, s] as const))('gives the verdict the rule computed in Python gives: %s', (_verdict, s) => {
    const result = judge(asSpectrum(s), library, calibration);
    expect(result.nearest?.index).toBe(s.nearest); // scipy cdist argmin
    expect(result.nearest?.distance).toBeCloseTo(s.nearestDistance, 13); // scipy cdist canberra / 2N
    result.distances.forEach((d, i) => expect(d).toBeCloseTo(s.distances[i], 13)); // scipy cdist canberra / 2N
    expect(result.typicality).toBeCloseTo(s.typicality, 15); // numpy mean(nearest > d)
    expect(result.verdict).toBe(s.verdict); // decision rule applied in generate.py
  });
});
