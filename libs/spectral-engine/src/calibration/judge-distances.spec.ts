import { spectrumDistance } from '../similarity/spectrum-distance';
import type { Spectrum } from '../spectrum';
import { distancesToLibrary } from './judge';

// Invented spectra; the reference for every distance is the engine's own checked `spectrumDistance`
// (itself checked against scipy.spatial.distance.canberra in test/reference/similarity).
const grid = Float64Array.from([10, 100, 1000, 10000]);
function lot(seed: number, frequencyHz = grid): Spectrum {
  return {
    frequencyHz,
    re: Float64Array.from([100 + seed, 90 - seed / 3, 0, 50 + seed * seed]),
    im: Float64Array.from([-10 - seed, 0, -4 + seed / 7, -1 / (seed + 1)]),
  };
}
const sample = lot(0.37);

describe('distances from a sample to every lot', () => {
  it('equals spectrumDistance bit for bit, lot by lot, including 0/0 terms', () => {
    const library = Array.from({ length: 40 }, (_, i) => lot(i / 3));
    const got = distancesToLibrary(sample, library);
    library.forEach((l, i) => expect(Object.is(got[i], spectrumDistance(sample, l))).toBe(true));
  });

  it('names the lot with a value that is not finite, as the checked distance does', () => {
    const bad = lot(2);
    (bad.im as Float64Array)[2] = Number.NaN;
    expect(() => distancesToLibrary(sample, [lot(1), lot(3), bad])).toThrow('judge: sample against lot 3: canberra: y[2] is NaN; every value must be a finite number');
    const infinite = lot(4);
    (infinite.re as Float64Array)[0] = Infinity;
    expect(() => distancesToLibrary(sample, [lot(1), infinite])).toThrow('judge: sample against lot 2: canberra: y[0] is Infinity');
  });

  it('still checks the grid of a lot that does not share the first lot frequencies', () => {
    const shifted = lot(1, Float64Array.from([10, 100, 1000, 10001]));
    expect(() => distancesToLibrary(sample, [lot(1), lot(2), shifted])).toThrow(/judge: sample against lot 3: spectra are on different grids: point 4/);
    const short = { frequencyHz: grid, re: Float64Array.from([1, 2, 3]), im: Float64Array.from([1, 2, 3]) };
    expect(() => distancesToLibrary(sample, [lot(1), short])).toThrow(/judge: sample against lot 2: the second spectrum has 4 frequencies but 3 real/);
  });

  it('reports a sample problem against lot 1', () => {
    const badSample = lot(1);
    (badSample.re as Float64Array)[1] = Number.NaN;
    expect(() => distancesToLibrary(badSample, [lot(1), lot(2)])).toThrow('judge: sample against lot 1: canberra: x[1] is NaN');
  });
});
