import { canberra, createSpectrumIndex, distanceMatrix, spectrumDistance, type Spectrum } from '@ohmprint/spectral-engine';
import fixture from '../fixtures/similarity/canberra.json';

const spectrum = (frequencyHz: number[], re: number[], im: number[]): Spectrum => ({
  frequencyHz: Float64Array.from(frequencyHz),
  re: Float64Array.from(re),
  im: Float64Array.from(im),
});

describe('Canberra distance against SciPy', () => {
  it('reproduces the worked values', () => {
    // SciPy 1.17 scipy.spatial.distance.canberra, worked values listed in the team's reference notes.
    expect(canberra([1, 2, 3, 4], [2, 2, 5, 1])).toBeCloseTo(71 / 60, 15);
    // SciPy: 0/0 terms count 0 → 43/21 (R's dist would rescale to 2.7301587301587298).
    expect(canberra([0, 1, 0, 5], [0, 0, 2, 5.5])).toBeCloseTo(2.0476190476190474, 15);
    expect(canberra([-1, 2.5, -3, 0], [1, 2, -1, 4])).toBeCloseTo(47 / 18, 15); // SciPy 1.17
    expect(canberra([1, 2, 3, 4], [2, 2, 5, 1], [0.5, 1, 2, 0.25])).toBeCloseTo(49 / 60, 15); // SciPy 1.17, w=
  });

  it.each(fixture.pairs.map((p) => [p.name, p] as const))('matches scipy.spatial.distance.canberra: %s', (_name, pair) => {
    const d = canberra(pair.u, pair.v, pair.w ?? undefined);
    expect(d).toBeCloseTo(pair.distance, 12); // fixtures/similarity/generate.py (scipy.spatial.distance.canberra)
  });

  it('reproduces the complex worked example', () => {
    const f = [10, 100, 1000, 10000];
    const zs = spectrum(f, [100, 80, 60, 55], [-50, -60, -40, -10]);
    const zr = spectrum(f, [102, 79, 61, 54], [-48, -63, -41, 0]);
    // SciPy 1.17: canberra(re) + canberra(im) = 1.0907731591917242, ÷ (2N = 8).
    expect(spectrumDistance(zs, zr)).toBeCloseTo(0.13634664489896553, 15);
  });

  it('matches cdist(metric="canberra") / 2N on spectra with a zero and a negative value', () => {
    const f = fixture.spectra.frequencyHz;
    const spectra = fixture.spectra.items.map((s) => spectrum(f, s.re, s.im));
    const d = distanceMatrix(spectra);
    fixture.spectra.distances.forEach((row, i) =>
      row.forEach((expected, j) => expect(d[i][j]).toBeCloseTo(expected, 13)), // generate.py: scipy cdist canberra / 2N
    );
    const hits = createSpectrumIndex(spectra).nearest(spectra[5], spectra.length);
    hits.forEach((hit) => expect(hit.distance).toBeCloseTo(fixture.spectra.distances[5][hit.index], 13)); // same SciPy matrix
  });
});
