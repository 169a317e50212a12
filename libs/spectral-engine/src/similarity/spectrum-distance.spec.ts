import type { Spectrum } from '../spectrum';
import { distanceMatrix } from './distance-matrix';
import { replicateAgreement } from './replicate-agreement';
import { spectrumDistance } from './spectrum-distance';

const spectrum = (f: number[], re: number[], im: number[]): Spectrum => ({
  frequencyHz: Float64Array.from(f),
  re: Float64Array.from(re),
  im: Float64Array.from(im),
});

describe('spectrumDistance', () => {
  const a = spectrum([10, 100, 1000], [100, 80, 60], [-50, -60, -40]);

  it('is 0 for identical spectra and 1 for spectra of opposite sign everywhere', () => {
    expect(spectrumDistance(a, a)).toBe(0);
    const opposite = spectrum([10, 100, 1000], [-100, -80, -60], [50, 60, 40]);
    expect(spectrumDistance(a, opposite)).toBe(1);
  });

  it('weighs a 10 % change alike at small and large impedances', () => {
    const small = spectrum([1, 2], [1, 1], [-1, -1]);
    const large = spectrum([1, 2], [1e6, 1e6], [-1e6, -1e6]);
    const scaled = (s: Spectrum) => ({ ...s, re: s.re.map((v) => v * 1.1), im: s.im.map((v) => v * 1.1) });
    expect(spectrumDistance(small, scaled(small))).toBeCloseTo(spectrumDistance(large, scaled(large)), 15);
  });

  it('refuses spectra on different grids and names the point that differs', () => {
    const other = spectrum([10, 120, 1000], [100, 80, 60], [-50, -60, -40]);
    expect(() => spectrumDistance(a, other)).toThrow('point 2 is 100 Hz in the first spectrum and 120 Hz in the second spectrum');
    const shorter = spectrum([10, 100], [100, 80], [-50, -60]);
    expect(() => spectrumDistance(a, shorter)).toThrow('has 3 frequencies and the second spectrum has 2');
  });

  it('refuses a spectrum whose arrays disagree in length', () => {
    const broken = { frequencyHz: Float64Array.from([1, 2, 3]), re: Float64Array.from([1, 2]), im: Float64Array.from([1, 2, 3]) };
    expect(() => spectrumDistance(a, broken)).toThrow('has 3 frequencies but 2 real and 3 imaginary values');
  });
});

describe('distanceMatrix and replicateAgreement', () => {
  const f = [1, 10, 100];
  const replicates = [
    spectrum(f, [100, 90, 80], [-10, -20, -10]),
    spectrum(f, [101, 90, 80], [-10, -20, -11]),
    spectrum(f, [100, 95, 80], [-10, -20, -10]),
  ];

  it('builds a symmetric matrix with a zero diagonal', () => {
    const d = distanceMatrix(replicates);
    expect(d.map((row, i) => row[i])).toEqual([0, 0, 0]);
    expect(d[0][2]).toBe(d[2][0]);
    expect(d[1][2]).toBeCloseTo(spectrumDistance(replicates[1], replicates[2]), 15);
  });

  it('names the pair when one replicate is on another grid', () => {
    const odd = spectrum([1, 10, 200], [1, 1, 1], [1, 1, 1]);
    expect(() => distanceMatrix([...replicates, odd])).toThrow('point 3 is 100 Hz in spectrum 1 and 200 Hz in spectrum 4');
  });

  it('reports the mean and the worst pair of replicates', () => {
    const d = distanceMatrix(replicates);
    const agreement = replicateAgreement(replicates);
    expect(agreement.pairCount).toBe(3);
    expect(agreement.meanDistance).toBeCloseTo((d[0][1] + d[0][2] + d[1][2]) / 3, 15);
    expect(agreement.maxDistance).toBe(Math.max(d[0][1], d[0][2], d[1][2]));
    expect(agreement.worstPair).toEqual([1, 2]);
    expect(() => replicateAgreement(replicates.slice(0, 1))).toThrow('at least two replicates');
  });
});
