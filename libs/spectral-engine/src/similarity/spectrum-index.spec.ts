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
