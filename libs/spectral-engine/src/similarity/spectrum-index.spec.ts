import fc from 'fast-check';
import type { Spectrum } from '../spectrum';
import { createSpectrumIndex } from './spectrum-index';
import { spectrumDistance } from './spectrum-distance';

const GRID = Float64Array.from([1, 10, 100, 1000, 10000]);

/** Values with the cases that matter for Canberra: zeros, negatives, near-duplicates and wide ranges. */
const value = fc.oneof(
  fc.constant(0),
  fc.double({ min: -1e4, max: 1e4, noNaN: true, noDefaultInfinity: true }),
  fc.integer({ min: -3, max: 3 }),
);
const spectrumArb = fc
  .tuple(fc.array(value, { minLength: 5, maxLength: 5 }), fc.array(value, { minLength: 5, maxLength: 5 }))
  .map(([re, im]): Spectrum => ({ frequencyHz: GRID, re: Float64Array.from(re), im: Float64Array.from(im) }));

function fullScan(library: Spectrum[], sample: Spectrum, k: number) {
  return library
    .map((s, index) => ({ index, distance: spectrumDistance(sample, s) }))
    .sort((a, b) => a.distance - b.distance || a.index - b.index)
    .slice(0, k);
}

describe('spectrum index', () => {
  it('returns exactly the top k of a full scan, ties to the lower position', () => {
    fc.assert(
      fc.property(
        fc.array(spectrumArb, { minLength: 1, maxLength: 40 }),
        spectrumArb,
        fc.integer({ min: 1, max: 12 }),
        fc.nat(),
        (library, sample, k, copyAt) => {
          // Duplicates of a library entry make exact ties, the hardest case for pruning.
          const withDuplicates = [...library, library[copyAt % library.length], library[0]];
          const index = createSpectrumIndex(withDuplicates);
          expect(index.nearest(sample, k)).toEqual(fullScan(withDuplicates, sample, k));
        },
      ),
      { numRuns: 200 },
    );
    // A generous limit: the machine is shared, and this test checks results, not speed.
  }, 60_000);

  it('returns the top k of a full scan on a broad library, where the pivot bounds rule most spectra out', () => {
    // Spectra spread over six decades, some exact copies, and a query near one of them: the shape
    // where the triangle-inequality bounds do the pruning.
    let seed = 12345;
    const random = () => (seed = (seed * 16807) % 2147483647) / 2147483647;
    const grid = Float64Array.from({ length: 16 }, (_, i) => 10 ** (i / 3));
    const library: Spectrum[] = Array.from({ length: 600 }, () => {
      const scale = 10 ** (6 * random());
      const tilt = random();
      return { frequencyHz: grid, re: grid.map((f) => scale / (1 + tilt * f) + random()), im: grid.map((f) => -scale * tilt * random() * f ** 0.5) };
    });
    library.push(library[17], library[420], library[3]);
    const near = library[250];
    for (const sample of [{ ...near, re: near.re.map((v) => v * 1.001) }, library[420], library[599]]) {
      for (const k of [1, 3, 10, 40]) expect(createSpectrumIndex(library).nearest(sample, k)).toEqual(fullScan(library, sample, k));
    }
  }, 60_000);

  it('returns the whole library, sorted, when k exceeds its size', () => {
    const library = [3, 0.5, 1].map((scale) => ({ frequencyHz: GRID, re: GRID.map((f) => scale * f), im: GRID.map(() => -scale) }));
    const sample = library[2];
    expect(createSpectrumIndex(library).nearest(sample, 10).map((hit) => hit.index)).toEqual([2, 1, 0]);
  });

  it('keeps its own copy of the library', () => {
    const lot: Spectrum = { frequencyHz: GRID, re: Float64Array.from([1, 2, 3, 4, 5]), im: Float64Array.from([-1, -1, -1, -1, -1]) };
    const index = createSpectrumIndex([lot]);
    const sample = { ...lot, re: Float64Array.from(lot.re), im: Float64Array.from(lot.im) };
    lot.re[0] = 1000;
    expect(index.nearest(sample, 1)[0].distance).toBe(0);
  });

  it('names the reference and value that cannot be indexed', () => {
    const good: Spectrum = { frequencyHz: GRID, re: GRID.map(() => 1), im: GRID.map(() => -1) };
    const bad: Spectrum = { frequencyHz: GRID, re: GRID.map(() => 1), im: Float64Array.from([-1, -1, Number.NaN, -1, -1]) };
    expect(() => createSpectrumIndex([good, bad])).toThrow('reference 2: im[2] is NaN');
    const offGrid: Spectrum = { ...good, frequencyHz: Float64Array.from([1, 10, 100, 1000, 20000]) };
    expect(() => createSpectrumIndex([good, offGrid])).toThrow('point 5 is 10000 Hz in reference 1 and 20000 Hz in reference 2');
    expect(() => createSpectrumIndex([])).toThrow('at least one reference');
  });

  it('refuses a sample on another grid or a k below 1', () => {
    const lot: Spectrum = { frequencyHz: GRID, re: GRID.map(() => 1), im: GRID.map(() => -1) };
    const index = createSpectrumIndex([lot]);
    expect(() => index.nearest({ ...lot, frequencyHz: GRID.map((f) => f * 2) }, 1)).toThrow('point 1 is 1 Hz in the reference library and 2 Hz in the sample');
    expect(() => index.nearest(lot, 0)).toThrow('k must be a whole number of at least 1');
  });
});
